// GET /api/recordings/:id: one recording with its facts, state and tags
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { getRecordingOrThrow } from "@/lib/ingest/get-recording";

type P = { id: string };

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ params, member }) =>
  ok(await getRecordingOrThrow(member.organisationId, idParam(params.id, "Recording not found"))),
);
