// Checks a passcode against a link, counting tries in the database (so every web process shares
// one count). A try is claimed atomically BEFORE the bcrypt comparison, and no try can be claimed
// while the link is locked: parallel guesses cannot slip past the limit while the first ones are
// still being compared. After MAX_PASSCODE_TRIES wrong tries the link refuses every passcode, the
// right one included, until the lock runs out; the right passcode clears the count.
import { and, eq, isNull, lte, or, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { shareLinks } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/password";
import { MAX_PASSCODE_TRIES, PASSCODE_LOCK_MS } from "./passcode-policy";
import { recordPasscodeRefused, type AccessFacts } from "./record-share-access";
import type { ResolvedShareLink } from "./resolve-share-link";

export type PasscodeOutcome = "accepted" | "refused";

export async function trySharePasscode(link: ResolvedShareLink, passcode: string, facts: AccessFacts, now = new Date()): Promise<PasscodeOutcome> {
  if (!link.passcodeHash) return "accepted";
  const at = sql`${now.toISOString()}::timestamptz`;
  // a lock that has run out starts a fresh count (passcode-policy.ts afterWrongPasscode, in plain code)
  const lapsed = sql`(${shareLinks.lockedUntil} is not null and ${shareLinks.lockedUntil} <= ${at})`;
  const tries = sql`(case when ${lapsed} then 1 else ${shareLinks.failedPasscodeAttempts} + 1 end)`;
  const [claimed] = await db()
    .update(shareLinks)
    .set({
      failedPasscodeAttempts: tries,
      lockedUntil: sql`case when ${tries} >= ${MAX_PASSCODE_TRIES} then ${at} + make_interval(secs => ${PASSCODE_LOCK_MS / 1000}) when ${lapsed} then null else ${shareLinks.lockedUntil} end`,
    })
    .where(and(eq(shareLinks.id, link.id), or(isNull(shareLinks.lockedUntil), lte(shareLinks.lockedUntil, now))))
    .returning({ tries: shareLinks.failedPasscodeAttempts });
  if (!claimed) {
    await recordPasscodeRefused(link, facts, "locked");
    return "refused";
  }
  if (await verifyPassword(passcode.slice(0, 200), link.passcodeHash)) {
    await db().update(shareLinks).set({ failedPasscodeAttempts: 0, lockedUntil: null }).where(eq(shareLinks.id, link.id));
    return "accepted";
  }
  await recordPasscodeRefused(link, facts, "wrong");
  return "refused";
}
