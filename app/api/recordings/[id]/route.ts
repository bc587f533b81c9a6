// GET /api/recordings/:id: one recording with its facts, state and tags
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { getRecordingOrThrow } from "@/lib/recordings/get-recording";

type P = { id: string };

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Recording not found");
  await requireInScope(member, "recording", id, "Recording not found");
  return ok(await getRecordingOrThrow(member.organisationId, id));
}
);
