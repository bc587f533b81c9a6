// Whether this browser has entered the right passcode for a link (links without one are open), and
// the Set-Cookie that records it once it has.
import "server-only";
import { env } from "@/lib/config/env";
import { parseCookies } from "@/lib/auth/read-session";
import { signUnlock, unlockCookieName, UNLOCK_TTL_S, verifyUnlock } from "./unlock-grant";

type Lockable = { id: string; passcodeHash: string | null; expiresAt: Date };

export function isUnlocked(link: Lockable, cookieHeader: string | null, nowMs = Date.now()): boolean {
  if (!link.passcodeHash) return true;
  const value = parseCookies(cookieHeader).get(unlockCookieName(link.id));
  return verifyUnlock(value, link.id, link.passcodeHash, env().MEDIA_SIGNING_KEY, nowMs);
}

export function unlockCookie(link: Lockable, secure: boolean, nowMs = Date.now()): string {
  if (!link.passcodeHash) throw new Error("link has no passcode");
  const expiresAt = Math.min(Math.floor(nowMs / 1000) + UNLOCK_TTL_S, Math.floor(link.expiresAt.getTime() / 1000));
  const maxAge = Math.max(0, expiresAt - Math.floor(nowMs / 1000));
  const value = signUnlock(link.id, link.passcodeHash, expiresAt, env().MEDIA_SIGNING_KEY);
  return `${unlockCookieName(link.id)}=${value}; Path=/; Max-Age=${maxAge}; HttpOnly; SameSite=Lax${secure ? "; Secure" : ""}`;
}


