// POST /api/invitations/accept: accept an invitation with the mailed token. Public: the token is the
// credential (256 random bits, stored hashed, single use, 7 days).
import { readJson, ok } from "@/lib/api/with-org";
import { ApiError, errorResponse } from "@/lib/api/errors";
import { claimTokenTry, forgiveTokenTry } from "@/lib/sharing/guard-share-token";
import { refuseCrossSite } from "@/lib/api/refuse-cross-site";
import { acceptInviteInput } from "@/lib/validation/members";
import { acceptInvitation } from "@/lib/members/accept-invitation";

export async function POST(req: Request): Promise<Response> {
  try {
    refuseCrossSite(req);
    // an address that keeps naming unknown tokens waits (429, Retry-After; lib/auth/attempt-limits.ts)
    const input = await readJson(req, acceptInviteInput);
    const wait = await claimTokenTry(req);
    if (wait) return wait.response();
    try {
      const accepted = await acceptInvitation(input);
      await forgiveTokenTry(req);
      return ok(accepted);
    } catch (err) {
      // a real invitation (used, withdrawn, expired, or a form error) gives the try back
      if (!(err instanceof ApiError && err.code === "not_found")) await forgiveTokenTry(req);
      throw err;
    }
  } catch (err) {
    return errorResponse(err);
  }
}
