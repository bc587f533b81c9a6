// The few next-auth adapter methods that e-mail sign-in links need, on our own tables.
// Sessions are JWTs, so no session or account tables. Links are only ever mailed to existing
// users, so creating a user through this path is refused.
import "server-only";
import type { Adapter, AdapterUser } from "next-auth/adapters";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users, verificationTokens } from "@/db/schema";

const toAdapterUser = (u: typeof users.$inferSelect): AdapterUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  emailVerified: u.emailVerifiedAt,
});

export function cairnAdapter(): Adapter {
  return {
    async createUser() {
      throw new Error("Accounts are created by invitation only");
    },
    async getUser(id) {
      const [u] = await db().select().from(users).where(eq(users.id, id));
      return u ? toAdapterUser(u) : null;
    },
    async getUserByEmail(email) {
      const [u] = await db().select().from(users).where(eq(users.email, email.toLowerCase()));
      return u ? toAdapterUser(u) : null;
    },
    async getUserByAccount() {
      return null;
    },
    async updateUser(user) {
      const [u] = await db()
        .update(users)
        .set({ ...(user.emailVerified !== undefined ? { emailVerifiedAt: user.emailVerified } : {}), updatedAt: new Date() })
        .where(eq(users.id, user.id!))
        .returning();
      return toAdapterUser(u);
    },
    async linkAccount() {
      return undefined;
    },
    async createVerificationToken(token) {
      await db().insert(verificationTokens).values(token);
      return token;
    },
    async useVerificationToken({ identifier, token }) {
      const [row] = await db()
        .delete(verificationTokens)
        .where(and(eq(verificationTokens.identifier, identifier), eq(verificationTokens.token, token)))
        .returning();
      return row ?? null;
    },
  };
}
