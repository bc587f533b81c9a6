// Reads the signed-in user from a request's session cookie (the next-auth JWT), without
// depending on Next's request context, so route handlers can be called directly in tests.
import "server-only";
import hkdf from "@panva/hkdf";
import { jwtDecrypt } from "jose";
import { parse as parseCookieHeader } from "cookie";
import { env } from "@/lib/config/env";

export const SESSION_COOKIES = ["__Secure-next-auth.session-token", "next-auth.session-token"];

/**
 * Cookies of a request, read with the `cookie` library (jshttp): a value whose percent-escapes do not
 * decode (for example `theme=50%`, which another app on the same host may set) is kept as it is
 * instead of throwing, so one stray cookie never takes a route down.
 */
export function parseCookies(header: string | null): Map<string, string> {
  const out = new Map<string, string>();
  for (const [name, value] of Object.entries(parseCookieHeader(header ?? ""))) if (value !== undefined) out.set(name, value);
  return out;
}

let derived: { secret: string; key: Promise<Uint8Array> } | null = null;

/**
 * next-auth 4's session token is a JWE ("dir", A256GCM) whose key is derived from NEXTAUTH_SECRET with
 * HKDF-SHA256 (RFC 5869), empty salt, info "NextAuth.js Generated Encryption Key" (next-auth/jwt's
 * getDerivedEncryptionKey). Its own `decode` derives the key again for every token, which took 0.2 ms of
 * CPU per request here (bench/list-api.ts, profiled); the key is derived once per secret instead, and
 * the token is opened with the same library call and clock tolerance as next-auth's `decode`.
 * tests/unit/auth/session-token.test.ts checks this against next-auth's own decode.
 */
function sessionKey(secret: string): Promise<Uint8Array> {
  if (derived?.secret !== secret) derived = { secret, key: hkdf("sha256", secret, "", "NextAuth.js Generated Encryption Key", 32) };
  return derived.key;
}

/** The claims of a session token, as next-auth's `decode` reads them; throws on a bad or expired token. */
export async function decodeSessionToken(token: string, secret: string): Promise<Record<string, unknown>> {
  const { payload } = await jwtDecrypt(token, await sessionKey(secret), { clockTolerance: 15 });
  return payload;
}

/** `sessionId` names the user_sessions row the token belongs to; a token without one is refused. */
export type SessionClaims = { userId: string; organisationId: string | null; sessionId: string };

export async function readSession(headers: Headers): Promise<SessionClaims | null> {
  const cookies = parseCookies(headers.get("cookie"));
  for (const name of SESSION_COOKIES) {
    // next-auth splits large tokens into name.0, name.1, ...
    let raw = cookies.get(name);
    if (!raw) {
      const chunks: string[] = [];
      for (let i = 0; cookies.has(`${name}.${i}`); i++) chunks.push(cookies.get(`${name}.${i}`)!);
      raw = chunks.join("") || undefined;
    }
    if (!raw) continue;
    try {
      const token = await decodeSessionToken(raw, env().NEXTAUTH_SECRET);
      if (token && typeof token.uid === "string" && typeof token.sid === "string")
        return { userId: token.uid, organisationId: (token.org as string | null) ?? null, sessionId: token.sid };
      return null;
    } catch {
      return null;
    }
  }
  return null;
}
