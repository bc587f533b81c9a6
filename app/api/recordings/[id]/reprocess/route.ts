// POST /api/recordings/:id/reprocess: process a recording again (retry after a failure, or a new
// frame rate for a raw controller stream: { fps: 25 }; { fps: null } clears the override)
import { z } from "zod";
import { withOrg, idParam } from "@/lib/api/with-org";
import { ApiError } from "@/lib/api/errors";
import { MAX_FPS, MIN_FPS } from "@/lib/processing/choose-frame-rate";
import { requestReprocess, RECORDING_NOT_FOUND } from "@/lib/recordings/request-reprocess";

type P = { id: string };
const body = z
  .object({ fps: z.number().min(MIN_FPS, `At least ${MIN_FPS} fps`).max(MAX_FPS, `At most ${MAX_FPS} fps`).nullable().optional() })
  .strict();

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
  const input = body.parse(json);
  const row = await requestReprocess(member.organisationId, id, input.fps);
  return Response.json(row, { status: 202, headers: { "Cache-Control": "no-store" } });
});
