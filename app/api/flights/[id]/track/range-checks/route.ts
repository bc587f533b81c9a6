// POST /api/flights/:id/track/range-checks: one click logs a link event of a signal trace as a range check,
// measured on the flight's track ({ recordingId, intervalIndex }); nothing else is typed
import { created, idParam, readJson, withOrg } from "@/lib/api/with-org";
import { requireInScope } from "@/lib/auth/client-scope";
import { createRangeCheckFromTrack } from "@/lib/tracks/create-range-check-from-track";
import { trackRangeCheckInput } from "@/lib/tracks/track-input";

type P = { id: string };
const NOT_FOUND = "Flight not found";

export const POST = withOrg<P>({ permission: "rangechecks.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "flight", id, NOT_FOUND);
  return created(await createRangeCheckFromTrack(member, id, await readJson(req, trackRangeCheckInput)));
});
