// GET/HEAD /api/media/stills/:id: a finding's full-resolution still (JPEG), authorized on every request
import { handleMediaRequest } from "@/lib/media-serving/handle-media-request";
import { idParam } from "@/lib/api/with-org";

type Ctx = { params: Promise<{ id: string }> };

async function handle(req: Request, ctx: Ctx) {
  const { id } = await ctx.params;
  return handleMediaRequest(req, () => ({ kind: "still", stillId: idParam(id.replace(/\.jpg$/i, ""), "File not found").toLowerCase() }));
}

export const GET = handle;
export const HEAD = handle;
