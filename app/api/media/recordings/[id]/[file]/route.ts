// GET/HEAD /api/media/recordings/:id/:file: a recording's derived file (playable MP4, poster, sprite,
// WebVTT thumbnail track) with HTTP Range, authorized on every request
import { handleMediaRequest } from "@/lib/media-serving/handle-media-request";
import { idParam } from "@/lib/api/with-org";
import { notFound } from "@/lib/api/errors";

type Ctx = { params: Promise<{ id: string; file: string }> };
const FILE = /^[a-z0-9][a-z0-9._-]*$/i;

async function handle(req: Request, ctx: Ctx) {
  const { id, file } = await ctx.params;
  return handleMediaRequest(req, () => {
    // derived files have plain names; anything else (encoded slashes, "..") names nothing
    if (!FILE.test(file) || file.includes("..")) throw notFound("File not found");
    return { kind: "recording-file", recordingId: idParam(id, "File not found").toLowerCase(), file };
  });
}

export const GET = handle;
export const HEAD = handle;
