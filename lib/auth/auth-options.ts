// next-auth configuration: e-mail + password, and e-mail sign-in links through our mail transport.
// The JWT carries only the user id and the active organisation; role is read from the database
// on every request so a changed or removed membership takes effect at once. The active
// organisation is the oldest membership at sign-in, and changes through the switcher.
import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { asc, eq } from "drizzle-orm";
import { z } from "zod";
import { db } from "@/db/client";
import { memberships, users } from "@/db/schema";
import { env } from "@/lib/config/env";
import { verifyPassword } from "./password";
import { assertNotLimited, forgiveAttempt, RateLimitedError } from "./attempt-limits";
import { clientAddress } from "@/lib/http/client-address";
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import { cairnAdapter } from "./adapter";
import { isMemberOf } from "./organisations-of-user";
import { endSession, startSession } from "./user-sessions";

const credentialsSchema = z.object({ email: z.string().trim().toLowerCase().email().max(320), password: z.string().min(1).max(200) });

async function firstOrganisationOf(userId: string): Promise<string | null> {
  const [m] = await db()
    .select({ organisationId: memberships.organisationId })
    .from(memberships)
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt))
    .limit(1);
  return m?.organisationId ?? null;
}

async function sendSignInLink(email: string, url: string): Promise<void> {
  const [u] = await db().select({ id: users.id }).from(users).where(eq(users.email, email));
  if (!u) return; // links go to existing accounts only
  const body = composeMail(
    ["Someone asked to sign in to Cairn with this address. The link works once, for 15 minutes.", "If it was not you, ignore this message."],
    { label: "Sign in to Cairn", url },
  );
  await sendMail({ to: email, subject: "Your Cairn sign-in link", ...body });
}

export const authOptions: NextAuthOptions = {
  secret: env().NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 12 * 3600 }, // 12 h: one working day
  pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-mail", error: "/sign-in" },
  adapter: cairnAdapter(), // e-mail links need the verification-token methods
  providers: [
    CredentialsProvider({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { type: "email" }, password: { type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        // limits per (account, address) and per address, never per account alone (attempt-limits.ts).
        // The route claimed this try, or answered 429, before next-auth got here (sign-in-limit-gate.ts);
        // while a wait runs even the right password gets the same answer as a wrong one.
        const address = clientAddress(req?.headers as Record<string, unknown> | undefined);
        try {
          await assertNotLimited("signin", email, address);
        } catch (err) {
          if (err instanceof RateLimitedError) return null;
          throw err;
        }
        const [u] = await db().select().from(users).where(eq(users.email, email));
        const ok = await verifyPassword(password, u?.passwordHash);
        if (!u || !ok) return null;
        await forgiveAttempt("signin", email, address);
        return { id: u.id, email: u.email, name: u.name };
      },
    }),
    EmailProvider({
      server: env().SMTP_URL,
      from: env().MAIL_FROM,
      maxAge: 15 * 60, // 15 min link lifetime
      // Requests are limited per (address asked for, client address) and per client address before
      // this runs (sign-in-limit-gate.ts). The lookup and the mail happen off the request path, so a
      // known and an unknown address get the same answer in the same time; a failure is logged.
      async sendVerificationRequest({ identifier, url }) {
        void sendSignInLink(identifier.toLowerCase(), url).catch((err) => console.warn(`[cairn] sign-in link not sent: ${(err as Error).message}`));
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user, trigger, session }) {
      if (user) {
        token.uid = user.id;
        token.org = await firstOrganisationOf(user.id);
        token.sid = await startSession(user.id);
      }
      // the organisation switcher (useSession().update({ organisationId })): only to an
      // organisation the person belongs to now; anything else leaves the session as it was
      if (trigger === "update" && typeof token.uid === "string") {
        const wanted = (session as { organisationId?: unknown } | undefined)?.organisationId;
        if (typeof wanted === "string" && z.string().uuid().safeParse(wanted).success && (await isMemberOf(token.uid, wanted))) token.org = wanted;
      }
      return token;
    },
    async session({ session, token }) {
      return { ...session, user: { ...session.user, id: token.uid as string, organisationId: token.org as string | null, sessionId: token.sid as string | undefined } };
    },
  },
  events: {
    // POST /api/auth/signout: the token is still readable here; its session row is ended, so a copy
    // of the cookie kept anywhere is refused from the next request on
    async signOut({ token }) {
      if (typeof token?.sid === "string") await endSession(token.sid);
    },
  },
};
