// GET /api/recordings/:id/trace: the recording's signal trace (intervals on the recorder's and the
// playable's clock, summary), or why it has none
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { readRecordingTrace } from "@/lib/recordings/read-recording-trace";
import { RECORDING_NOT_FOUND } from "@/lib/recordings/request-reprocess";

type P = { id: string };

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, RECORDING_NOT_FOUND);
  await requireInScope(member, "recording", id, RECORDING_NOT_FOUND);
  return ok(await readRecordingTrace(member.organisationId, id));
}
);
