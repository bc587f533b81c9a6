// A signed-in person changes their own password: the current one must be right, and every other
// open session of the person ends (a stolen cookie stops working); the session making the change stays.
import "server-only";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { hashPassword, verifyPassword } from "./password";
import { endSessionsOf } from "./user-sessions";

export async function changePassword(userId: string, sessionId: string, current: string, next: string): Promise<{ endedSessions: number }> {
  const [u] = await db().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, userId));
  if (!u || !(await verifyPassword(current, u.passwordHash))) {
    throw new ApiError("unprocessable", "The current password is not right", { currentPassword: ["Not right"] });
  }
  const passwordHash = await hashPassword(next);
  return db().transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, userId));
    return { endedSessions: await endSessionsOf(userId, tx, sessionId) };
  });
}
