// In front of next-auth's own handler: a password sign-in (POST /api/auth/callback/password) or an
// e-mail link request (POST /api/auth/signin/email) from an address that must wait gets 429 with
// Retry-After here, because next-auth's credentials flow can only answer through its own redirect
// (an authorize() that returns null is "CredentialsSignin", never a 429).
// The body keeps next-auth's shape for its client (`url` with ?error=rate_limited, which signIn()
// returns as `error`), plus the app's error object.
import "server-only";
import { assertNotLimited, claimAttempt, countFailure, RateLimitedError } from "./attempt-limits";
import { clientAddress } from "@/lib/http/client-address";
import { env } from "@/lib/config/env";

function limitedAnswer(err: RateLimitedError): Response {
  const url = `${env().APP_URL.replace(/\/$/, "")}/sign-in?error=rate_limited&retryAfter=${err.retryAfterSec}`;
  return Response.json(
    { url, error: { code: "rate_limited", message: err.message } },
    { status: 429, headers: { "Retry-After": String(err.retryAfterSec), "Cache-Control": "no-store" } },
  );
}

/** A 429 answer when this sign-in try must wait, else null (next-auth handles the request). */
export async function signInLimitGate(req: Request, path: string[] | undefined): Promise<Response | null> {
  if (req.method !== "POST" || !path) return null;
  const [action, provider] = path;
  const password = action === "callback" && provider === "password";
  const link = action === "signin" && provider === "email";
  if (!password && !link) return null;
  const form = await req
    .clone()
    .formData()
    .catch(() => null);
  const raw = form?.get("email");
  // the same normalising as next-auth's and ours: trimmed, lower case
  const email = typeof raw === "string" ? raw.trim().toLowerCase().slice(0, 320) : "";
  if (!email) return null; // next-auth answers a malformed post itself
  const address = clientAddress(req.headers);
  try {
    if (password) {
      // the try is claimed here, before next-auth compares the password (parallel guesses cannot
      // all slip past); authorize() gives it back when the password is right
      await claimAttempt("signin", email, address);
    } else {
      await assertNotLimited("signin-link", email, address);
      // every link request counts (each one sends a mail); the one that goes over waits too
      const waitMs = await countFailure("signin-link", email, address);
      if (waitMs > 0) throw new RateLimitedError(Math.ceil(waitMs / 1000));
    }
  } catch (err) {
    if (err instanceof RateLimitedError) return limitedAnswer(err);
    throw err;
  }
  return null;
}
