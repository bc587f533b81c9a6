// Limits on guessing: sign-in passwords, e-mail sign-in links, share-link passcodes and unknown
// tokens. Counted in Redis (every web process shares one count) per pair of subject and address
// (an account, a link) and per address alone; never per subject alone, so that a stranger's wrong
// tries from elsewhere cannot keep the owner out of their own account or link from their own address.
// After the free tries, every further failure sets a wait that doubles, up to a ceiling; while a wait
// runs the answer is 429 with Retry-After (RFC 6585 section 4, RFC 9110 section 10.2.3).
// Common practice, no published source: a handful of free tries, then exponential backoff.
import "server-only";
import { createHash } from "node:crypto";
import { ApiError } from "@/lib/api/errors";
import { env } from "@/lib/config/env";
import { redis } from "@/lib/queue/redis";

export type AttemptKind = "signin" | "signin-link" | "passcode" | "token";

type Policy = {
  /** failures per (subject, address) before the first wait; null when the kind has no subject */
  pairFree: number | null;
  /** failures per address, all subjects together, before the first wait */
  addressFree: number;
  firstWaitMs: number;
  maxWaitMs: number;
  /** how long failures are remembered after the last one */
  memorySec: number;
};

export const ATTEMPT_POLICIES: Record<AttemptKind, Policy> = {
  signin: { pairFree: 5, addressFree: 30, firstWaitMs: 30_000, maxWaitMs: 3_600_000, memorySec: 24 * 3600 },
  // every request counts (each sends a mail): 5 per account and address, 30 per address
  "signin-link": { pairFree: 5, addressFree: 30, firstWaitMs: 60_000, maxWaitMs: 3_600_000, memorySec: 3600 },
  passcode: { pairFree: 5, addressFree: 30, firstWaitMs: 30_000, maxWaitMs: 3_600_000, memorySec: 24 * 3600 },
  // unknown share-link or invitation tokens (256 random bits: nobody guesses one, but nobody should try at speed)
  token: { pairFree: null, addressFree: 20, firstWaitMs: 30_000, maxWaitMs: 3_600_000, memorySec: 24 * 3600 },
};

/** The wait after `failures` failures with `free` free ones: none, then first, 2 x first, 4 x first, ... up to max. */
export function waitAfter(failures: number, free: number, p: Pick<Policy, "firstWaitMs" | "maxWaitMs">): number {
  if (failures <= free) return 0;
  return Math.min(p.maxWaitMs, p.firstWaitMs * 2 ** Math.min(failures - free - 1, 30));
}

export class RateLimitedError extends ApiError {
  constructor(public readonly retryAfterSec: number) {
    super("rate_limited", `Too many tries. Try again in ${describeWait(retryAfterSec)}.`);
  }
  /** The 429 answer in the app's error shape, with Retry-After in seconds. */
  response(extraHeaders: Record<string, string> = {}): Response {
    return Response.json(
      { error: { code: this.code, message: this.message } },
      { status: 429, headers: { "Retry-After": String(this.retryAfterSec), "Cache-Control": "no-store", ...extraHeaders } },
    );
  }
}

export function describeWait(sec: number): string {
  return sec < 90 ? `${sec} seconds` : `${Math.ceil(sec / 60)} minutes`;
}

const digest = (s: string) => createHash("sha256").update(s.toLowerCase()).digest("hex").slice(0, 32);
const keys = (kind: AttemptKind, subject: string | null, address: string) => {
  const base = `${env().QUEUE_PREFIX}:al:${kind}`;
  return {
    pairCount: subject === null ? null : `${base}:pc:${digest(`${subject}\u0000${address}`)}`,
    pairWait: subject === null ? null : `${base}:pw:${digest(`${subject}\u0000${address}`)}`,
    addressCount: `${base}:ac:${digest(address)}`,
    addressWait: `${base}:aw:${digest(address)}`,
  };
};

/** Throws RateLimitedError (429) while the pair or the address is waiting. */
export async function assertNotLimited(kind: AttemptKind, subject: string | null, address: string): Promise<void> {
  const k = keys(kind, subject, address);
  const waits = await Promise.all([k.pairWait ? redis().pttl(k.pairWait) : Promise.resolve(-2), redis().pttl(k.addressWait)]);
  const ms = Math.max(...waits);
  if (ms > 0) throw new RateLimitedError(Math.max(1, Math.ceil(ms / 1000)));
}

/** Counts one failure (or, for sign-in links, one request); returns the wait it set in ms (0: none). */
export async function countFailure(kind: AttemptKind, subject: string | null, address: string): Promise<number> {
  const p = ATTEMPT_POLICIES[kind];
  const k = keys(kind, subject, address);
  let wait = 0;
  const bump = async (count: string, waitKey: string, free: number) => {
    const n = await redis().incr(count);
    await redis().expire(count, p.memorySec);
    const ms = waitAfter(n, free, p);
    if (ms > 0) {
      await redis().set(waitKey, "1", "PX", ms);
      wait = Math.max(wait, ms);
    }
  };
  if (k.pairCount && k.pairWait && p.pairFree !== null) await bump(k.pairCount, k.pairWait, p.pairFree);
  await bump(k.addressCount, k.addressWait, p.addressFree);
  return wait;
}

/**
 * Claims one try before it is checked (so parallel guesses cannot all slip past the limit while the
 * first ones are still being compared): throws RateLimitedError while a wait runs, or when this very
 * try goes over the free ones. A try that turns out right is forgiven (forgiveAttempt).
 */
export async function claimAttempt(kind: AttemptKind, subject: string | null, address: string): Promise<void> {
  await assertNotLimited(kind, subject, address);
  const waitMs = await countFailure(kind, subject, address);
  if (waitMs > 0) throw new RateLimitedError(Math.ceil(waitMs / 1000));
}

/** A right try: the pair starts afresh, and the address's count gives back the try it claimed. */
export async function forgiveAttempt(kind: AttemptKind, subject: string | null, address: string): Promise<void> {
  const k = keys(kind, subject, address);
  if (k.pairCount && k.pairWait) await redis().del(k.pairCount, k.pairWait);
  const n = await redis().decr(k.addressCount);
  if (n <= 0) await redis().del(k.addressCount);
}
