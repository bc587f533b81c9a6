// Checks a passcode against a link. Wrong tries are limited per (link, address) and per address
// (lib/auth/attempt-limits.ts: 429 with Retry-After, waits that double), never per link alone: a
// stranger guessing from elsewhere cannot lock the recipient out of their own link. The right
// passcode clears the pair's count.
import { verifyPassword } from "@/lib/auth/password";
import { claimAttempt, forgiveAttempt, RateLimitedError } from "@/lib/auth/attempt-limits";
import { recordPasscodeRefused, type AccessFacts } from "./record-share-access";
import type { ResolvedShareLink } from "./resolve-share-link";

export type PasscodeOutcome = "accepted" | "refused";

/** Throws RateLimitedError while this address must wait for this link. */
export async function trySharePasscode(link: ResolvedShareLink, passcode: string, facts: AccessFacts, address: string): Promise<PasscodeOutcome> {
  if (!link.passcodeHash) return "accepted";
  try {
    await claimAttempt("passcode", link.id, address);
  } catch (err) {
    if (err instanceof RateLimitedError) await recordPasscodeRefused(link, facts, "locked");
    throw err;
  }
  if (await verifyPassword(passcode.slice(0, 200), link.passcodeHash)) {
    await forgiveAttempt("passcode", link.id, address);
    return "accepted";
  }
  await recordPasscodeRefused(link, facts, "wrong");
  return "refused";
}
