// GET/HEAD /api/s/media/:grant: one file behind a share link, by its short-lived signed address,
// with HTTP Range (RFC 9110). Link revocation, expiry and scope are re-checked on every request.
import { serveShareMedia } from "@/lib/sharing/serve-share-media";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ grant: string }> };

export async function GET(req: Request, { params }: Ctx): Promise<Response> {
  return serveShareMedia(req, (await params).grant);
}

export async function HEAD(req: Request, { params }: Ctx): Promise<Response> {
  return serveShareMedia(req, (await params).grant);
}
