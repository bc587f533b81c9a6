// GET/POST /s/:token: the door of a share link. Answers with a real status: 404 for an unknown
// link or a refused passcode, 410 for an expired or revoked one, 429 with Retry-After while this
// address must wait (too many unknown tokens, or wrong passcodes for this link), the passcode form
// when one is needed, and otherwise a 303 to the viewer. Nothing here logs or stores the token.
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { shareGateResponse } from "@/lib/sharing/share-gate-page";
import { isUnlocked, unlockCookie } from "@/lib/sharing/share-unlock";
import { trySharePasscode } from "@/lib/sharing/try-share-passcode";
import { SHARE_RESPONSE_HEADERS } from "@/lib/sharing/share-response-headers";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { verifyPassword } from "@/lib/auth/password";
import { RateLimitedError } from "@/lib/auth/attempt-limits";
import { clientAddress } from "@/lib/http/client-address";
import { claimTokenTry, forgiveTokenTry } from "@/lib/sharing/guard-share-token";

const limited = (err: RateLimitedError) => shareGateResponse("limited", { retryAfterSec: err.retryAfterSec }, { "Retry-After": String(err.retryAfterSec) });

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };

const toViewer = (token: string, cookie?: string) =>
  new Response(null, { status: 303, headers: { ...SHARE_RESPONSE_HEADERS, Location: `/s/${token}/view`, ...(cookie ? { "Set-Cookie": cookie } : {}) } });

export async function GET(req: Request, { params }: Ctx): Promise<Response> {
  const { token } = await params;
  const wait = await claimTokenTry(req);
  if (wait) return limited(wait);
  const r = await resolveShareLink(token);
  if (r.kind === "unknown") return shareGateResponse("unknown");
  await forgiveTokenTry(req);
  if (r.kind === "gone") return shareGateResponse(r.reason, { organisationName: r.link.organisationName, endedAt: r.reason === "expired" ? r.link.expiresAt : r.link.revokedAt });
  if (!isUnlocked(r.link, req.headers.get("cookie"))) return shareGateResponse("passcode", { organisationName: r.link.organisationName });
  return toViewer(token);
}

export async function POST(req: Request, { params }: Ctx): Promise<Response> {
  const { token } = await params;
  let passcode = "";
  try {
    const value = (await req.formData()).get("passcode");
    passcode = typeof value === "string" ? value : "";
  } catch {
    passcode = "";
  }
  const wait = await claimTokenTry(req);
  if (wait) return limited(wait);
  const r = await resolveShareLink(token);
  if (r.kind === "unknown") {
    // the same bcrypt work as a real check, so timing does not tell a guessed token from a real one
    await verifyPassword(passcode || "-", null);
    return shareGateResponse("unknown");
  }
  await forgiveTokenTry(req);
  if (r.kind === "gone") return shareGateResponse(r.reason, { organisationName: r.link.organisationName, endedAt: r.reason === "expired" ? r.link.expiresAt : r.link.revokedAt });
  if (!r.link.passcodeHash) return toViewer(token);
  let outcome;
  try {
    outcome = await trySharePasscode(r.link, passcode, requestFacts(req), clientAddress(req.headers));
  } catch (err) {
    if (err instanceof RateLimitedError) return limited(err);
    throw err;
  }
  if (outcome === "refused") return shareGateResponse("passcode-refused", { organisationName: r.link.organisationName });
  const secure = new URL(req.url).protocol === "https:";
  return toViewer(token, unlockCookie(r.link, secure));
}
