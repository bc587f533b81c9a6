// GET/HEAD /api/s/:token/package: the evidence package a share link carries, as a ZIP download with
// Range (a cut download resumes). Refused like the share page: 404 unknown, still locked by its
// passcode, or carrying no package; 410 link expired or revoked, or package past its keep date.
import { errorResponse } from "@/lib/api/errors";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { loadServablePackage, servePackageDownload } from "@/lib/evidence-packages/serve-evidence-package";
import { claimTokenTry, forgiveTokenTry } from "@/lib/sharing/guard-share-token";
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { SHARE_RESPONSE_HEADERS } from "@/lib/sharing/share-response-headers";
import { isUnlocked } from "@/lib/sharing/share-unlock";

export const dynamic = "force-dynamic";

async function handle(req: Request, { params }: { params: Promise<{ token: string }> }): Promise<Response> {
  const { token } = await params;
  const wait = await claimTokenTry(req);
  if (wait) return wait.response(SHARE_RESPONSE_HEADERS);
  const r = await resolveShareLink(token);
  if (r.kind !== "unknown") await forgiveTokenTry(req);
  if (r.kind === "gone") return Response.json({ error: { code: "gone", message: `This share link has ${r.reason === "revoked" ? "been revoked" : "expired"}.` } }, { status: 410, headers: SHARE_RESPONSE_HEADERS });
  if (r.kind === "unknown" || !isUnlocked(r.link, req.headers.get("cookie")) || !r.link.evidencePackageId) {
    return Response.json({ error: { code: "not_found", message: "Not found" } }, { status: 404, headers: SHARE_RESPONSE_HEADERS });
  }
  try {
    const file = await loadServablePackage(r.link.organisationId, r.link.evidencePackageId, new Date(), r.link.jobId);
    const res = await servePackageDownload(req, file, { shareLinkId: r.link.id }, requestFacts(req));
    for (const [k, v] of Object.entries(SHARE_RESPONSE_HEADERS)) if (!res.headers.has(k)) res.headers.set(k, v);
    return res;
  } catch (err) {
    return errorResponse(err);
  }
}

export const GET = handle;
export const HEAD = handle;
