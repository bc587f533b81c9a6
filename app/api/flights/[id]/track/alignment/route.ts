// POST /api/flights/:id/track/alignment: store the alignment of the track with the recordings, either the
// proposal from file times ({ method: "file_times" }) or a frame matched to a track point
// ({ method: "frame_match", recordingId, frame, pointIndex }); answers the track view under it
import { idParam, ok, readJson, withOrg } from "@/lib/api/with-org";
import { requireInScope } from "@/lib/auth/client-scope";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { loadFlightTrackView } from "@/lib/tracks/load-flight-track";
import { setTrackAlignment } from "@/lib/tracks/set-track-alignment";
import { trackAlignmentInput } from "@/lib/tracks/track-input";

type P = { id: string };
const NOT_FOUND = "Flight not found";

export const POST = withOrg<P>({ permission: "rangechecks.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "flight", id, NOT_FOUND);
  const alignment = await setTrackAlignment(member, id, await readJson(req, trackAlignmentInput), requestFacts(req));
  return ok({ alignment, view: await loadFlightTrackView(member.organisationId, id) });
});
