// GET/POST /s/:token: the door of a share link. Answers with a real status: 404 for an unknown
// link or a refused passcode, 410 for an expired or revoked one, the passcode form when one is
// needed, and otherwise a 303 to the viewer. Nothing here logs or stores the token.
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { shareGateResponse } from "@/lib/sharing/share-gate-page";
import { isUnlocked, unlockCookie } from "@/lib/sharing/share-unlock";
import { trySharePasscode } from "@/lib/sharing/try-share-passcode";
import { SHARE_RESPONSE_HEADERS } from "@/lib/sharing/share-response-headers";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { verifyPassword } from "@/lib/auth/password";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };

const toViewer = (token: string, cookie?: string) =>
  new Response(null, { status: 303, headers: { ...SHARE_RESPONSE_HEADERS, Location: `/s/${token}/view`, ...(cookie ? { "Set-Cookie": cookie } : {}) } });

export async function GET(req: Request, { params }: Ctx): Promise<Response> {
  const { token } = await params;
  const r = await resolveShareLink(token);
  if (r.kind === "unknown") return shareGateResponse("unknown");
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
  const r = await resolveShareLink(token);
  if (r.kind === "unknown") {
    // the same bcrypt work as a real check, so timing does not tell a guessed token from a real one
    await verifyPassword(passcode || "-", null);
    return shareGateResponse("unknown");
  }
  if (r.kind === "gone") return shareGateResponse(r.reason, { organisationName: r.link.organisationName, endedAt: r.reason === "expired" ? r.link.expiresAt : r.link.revokedAt });
  if (!r.link.passcodeHash) return toViewer(token);
  const outcome = await trySharePasscode(r.link, passcode, requestFacts(req));
  if (outcome === "refused") return shareGateResponse("passcode-refused", { organisationName: r.link.organisationName });
  const secure = new URL(req.url).protocol === "https:";
  return toViewer(token, unlockCookie(r.link, secure));
}
