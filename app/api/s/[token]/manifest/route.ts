// GET /api/s/:token/manifest: fresh signed addresses for the client's page (they live 10 minutes).
// Refused like the page itself: 404 unknown or still locked by its passcode, 410 expired or revoked.
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { buildShareView } from "@/lib/sharing/build-share-view";
import { isUnlocked } from "@/lib/sharing/share-unlock";
import { SHARE_RESPONSE_HEADERS } from "@/lib/sharing/share-response-headers";
import { claimTokenTry, forgiveTokenTry } from "@/lib/sharing/guard-share-token";

export const dynamic = "force-dynamic";

export async function GET(req: Request, { params }: { params: Promise<{ token: string }> }): Promise<Response> {
  const { token } = await params;
  const wait = await claimTokenTry(req);
  if (wait) return wait.response(SHARE_RESPONSE_HEADERS);
  const r = await resolveShareLink(token);
  if (r.kind !== "unknown") await forgiveTokenTry(req);
  if (r.kind === "gone") return Response.json({ error: { code: "gone", message: `This share link has ${r.reason === "revoked" ? "been revoked" : "expired"}.` } }, { status: 410, headers: SHARE_RESPONSE_HEADERS });
  if (r.kind === "unknown" || !isUnlocked(r.link, req.headers.get("cookie"))) {
    return Response.json({ error: { code: "not_found", message: "Not found" } }, { status: 404, headers: SHARE_RESPONSE_HEADERS });
  }
  return Response.json(await buildShareView(r.link), { headers: SHARE_RESPONSE_HEADERS });
}
