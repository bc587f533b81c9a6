// How many wrong passcodes a link takes before it waits, and for how long.
// Common practice, no published source: a handful of tries, then a pause long enough that guessing
// even a short passcode takes years (5 tries per 15 min is 480 a day).
export const MAX_PASSCODE_TRIES = 5;
export const PASSCODE_LOCK_MS = 15 * 60 * 1000; // 15 min

export function isPasscodeLocked(link: { lockedUntil: Date | null }, now: Date = new Date()): boolean {
  return link.lockedUntil !== null && link.lockedUntil.getTime() > now.getTime();
}

/** The counter and lock after one more wrong try; a lock that has run out starts a fresh count. */
export function afterWrongPasscode(
  link: { failedPasscodeAttempts: number; lockedUntil: Date | null },
  now: Date = new Date(),
): { failedPasscodeAttempts: number; lockedUntil: Date | null } {
  const lapsed = link.lockedUntil !== null && link.lockedUntil.getTime() <= now.getTime();
  const tries = (lapsed ? 0 : link.failedPasscodeAttempts) + 1;
  if (tries >= MAX_PASSCODE_TRIES) return { failedPasscodeAttempts: tries, lockedUntil: new Date(now.getTime() + PASSCODE_LOCK_MS) };
  return { failedPasscodeAttempts: tries, lockedUntil: lapsed ? null : link.lockedUntil };
}
