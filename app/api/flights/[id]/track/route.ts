// GET /api/flights/:id/track: the flight's track, its alignment and the distances at every link event and
// finding; POST: import a track file (GPX 1.1 or CSV) as evidence ({ fileName, contentBase64 }, ?name=)
import { created, idParam, ok, withOrg } from "@/lib/api/with-org";
import { requireInScope } from "@/lib/auth/client-scope";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { importTrack } from "@/lib/tracks/import-track";
import { loadFlightTrackView } from "@/lib/tracks/load-flight-track";
import { readTrackBody } from "@/lib/tracks/read-track-body";
import { trackImportInput } from "@/lib/tracks/track-input";

type P = { id: string };
const NOT_FOUND = "Flight not found";

export const GET = withOrg<P>({ permission: "range.read" }, async ({ params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "flight", id, NOT_FOUND);
  return ok(await loadFlightTrackView(member.organisationId, id));
});

export const POST = withOrg<P>({ permission: "recordings.upload" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "flight", id, NOT_FOUND);
  const body = trackImportInput.parse(await readTrackBody(req));
  const bytes = new Uint8Array(Buffer.from(body.contentBase64, "base64"));
  return created(await importTrack(member, id, { name: body.fileName, bytes }, requestFacts(req)));
});
