// POST /api/invitations/accept: accept an invitation with the mailed token. Public: the token is the
// credential (256 random bits, stored hashed, single use, 7 days).
import { readJson, ok } from "@/lib/api/with-org";
import { errorResponse } from "@/lib/api/errors";
import { refuseCrossSite } from "@/lib/api/refuse-cross-site";
import { acceptInviteInput } from "@/lib/validation/members";
import { acceptInvitation } from "@/lib/work/accept-invitation";

export async function POST(req: Request): Promise<Response> {
  try {
    refuseCrossSite(req);
    return ok(await acceptInvitation(await readJson(req, acceptInviteInput)));
  } catch (err) {
    return errorResponse(err);
  }
}
