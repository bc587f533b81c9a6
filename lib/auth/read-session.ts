// Reads the signed-in user from a request's session cookie (the next-auth JWT), without
// depending on Next's request context, so route handlers can be called directly in tests.
import { decode } from "next-auth/jwt";
import { env } from "@/lib/config/env";

export const SESSION_COOKIES = ["__Secure-next-auth.session-token", "next-auth.session-token"];

export function parseCookies(header: string | null): Map<string, string> {
  const out = new Map<string, string>();
  for (const part of (header ?? "").split(";")) {
    const i = part.indexOf("=");
    if (i < 0) continue;
    out.set(part.slice(0, i).trim(), decodeURIComponent(part.slice(i + 1).trim()));
  }
  return out;
}

export type SessionClaims = { userId: string; organisationId: string | null };

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
      const token = await decode({ token: raw, secret: env().NEXTAUTH_SECRET });
      if (token && typeof token.uid === "string") return { userId: token.uid, organisationId: (token.org as string | null) ?? null };
    } catch {
      return null;
    }
  }
  return null;
}
