// POST /api/recordings/:id/reprocess: process a recording again (retry after a failure, or a new
// frame rate for a raw controller stream: { fps: 25 }; { fps: null } clears the override)
import { withOrg, idParam } from "@/lib/api/with-org";
import { ApiError } from "@/lib/api/errors";
import { reprocessInput } from "@/lib/recordings/recording-input";
import { requestReprocess, RECORDING_NOT_FOUND } from "@/lib/recordings/request-reprocess";

type P = { id: string };

export const POST = withOrg<P>({ permission: "recordings.reprocess" }, async ({ req, params, member }) => {
  const id = idParam(params.id, RECORDING_NOT_FOUND);
  // An empty body is a plain retry.
  const text = await req.text();
  let json: unknown = {};
  if (text.trim() !== "") {
    try {
      json = JSON.parse(text);
    } catch {
      throw new ApiError("bad_request", "The request body is not valid JSON");
    }
  }
  const input = reprocessInput.parse(json);
  const row = await requestReprocess(member.organisationId, id, input.fps);
  return Response.json(row, { status: 202, headers: { "Cache-Control": "no-store" } });
});
