// POST /api/recordings/:id/deletion: delete a recording's files (owner only, never under legal
// hold). Any member who can see the recording may ask, so a refused attempt is recorded in the
// custody log before it is refused.
import { recordingDeletionInput } from "@/lib/recordings/recording-input";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { deleteRecording } from "@/lib/recordings/delete-recording";
import { requireInScope } from "@/lib/auth/client-scope";

type P = { id: string };

export const POST = withOrg<P>({ permission: "recordings.read" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Recording not found");
  // a client account cannot see another client's recording, so cannot ask either: 404
  await requireInScope(member, "recording", id, "Recording not found");
  return ok(await deleteRecording(member, id, await readJson(req, recordingDeletionInput), requestFacts(req)));
});
