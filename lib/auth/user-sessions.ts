// Server-side record of signed-in sessions. next-auth 4's JWT sessions are stateless, so each token
// carries the id of a user_sessions row (`sid`) and every request checks that the row is still open.
// Ending the row ends the session at the next request, whatever the token's expiry says.
import "server-only";
import { and, eq, isNull, lt, ne, or } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { userSessions } from "@/db/schema";

/** Opens a session row at sign-in; its id goes into the JWT. */
export async function startSession(userId: string, tx: DbOrTx = db()): Promise<string> {
  const [row] = await tx.insert(userSessions).values({ userId }).returning({ id: userSessions.id });
  // rows of sessions past any token's lifetime are of no further use
  await tx.delete(userSessions).where(and(eq(userSessions.userId, userId), or(lt(userSessions.endedAt, new Date(Date.now() - SESSION_ROW_KEEP_MS)), lt(userSessions.createdAt, new Date(Date.now() - SESSION_ROW_KEEP_MS)))));
  return row.id;
}

// a JWT lives 12 h from its last refresh; a row is kept well past that before it is purged.
// A refreshed token of a purged row is refused, which only means signing in again after 7 days.
const SESSION_ROW_KEEP_MS = 7 * 24 * 3600 * 1000;

/** Sign-out: ends this one session. */
export async function endSession(sessionId: string, tx: DbOrTx = db()): Promise<void> {
  await tx.update(userSessions).set({ endedAt: new Date() }).where(and(eq(userSessions.id, sessionId), isNull(userSessions.endedAt)));
}

/** Password change, role change, removal: ends every open session of the person (but `keep`, if given). */
export async function endSessionsOf(userId: string, tx: DbOrTx = db(), keep?: string): Promise<number> {
  const rows = await tx
    .update(userSessions)
    .set({ endedAt: new Date() })
    .where(and(eq(userSessions.userId, userId), isNull(userSessions.endedAt), keep ? ne(userSessions.id, keep) : undefined))
    .returning({ id: userSessions.id });
  return rows.length;
}

export async function isSessionOpen(sessionId: string): Promise<boolean> {
  const [row] = await db().select({ id: userSessions.id }).from(userSessions).where(and(eq(userSessions.id, sessionId), isNull(userSessions.endedAt)));
  return Boolean(row);
}
