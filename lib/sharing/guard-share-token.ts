// Token guessing at the share-link door and the invitation page: every try with a token is claimed
// per address before the token is looked up, and given back when the token is real, so an address
// that keeps naming tokens that do not exist waits, with 429 and Retry-After
// (lib/auth/attempt-limits.ts, kind "token", per address only: a real link's recipient elsewhere is
// never slowed).
import { claimAttempt, forgiveAttempt, RateLimitedError } from "@/lib/auth/attempt-limits";
import { clientAddress } from "@/lib/http/client-address";

/** Claims one token try: the RateLimitedError when this address must wait, else null. */
export async function claimTokenTry(req: Request): Promise<RateLimitedError | null> {
  try {
    await claimAttempt("token", null, clientAddress(req.headers));
    return null;
  } catch (err) {
    if (err instanceof RateLimitedError) return err;
    throw err;
  }
}

/** The token named a real link or invitation: the try does not count. */
export async function forgiveTokenTry(req: Request): Promise<void> {
  await forgiveAttempt("token", null, clientAddress(req.headers));
}
