// The cookie a recipient gets after entering the right passcode: an expiry and a MAC over the link
// id, the expiry and the link's current passcode hash (a new passcode voids old unlocks). It opens
// nothing by itself: every request still resolves the token and checks revocation and expiry.
import { hmacSha256, sameBytes } from "./hmac";

export const UNLOCK_TTL_S = 12 * 3600; // 12 h: one sitting; capped by the link's own expiry
const PURPOSE = "cairn/share-unlock/v1\n";

export const unlockCookieName = (linkId: string) => `cairn_unlock_${linkId.replace(/-/g, "")}`;

function mac(linkId: string, expiresAt: number, passcodeHash: string, key: string): Buffer {
  return hmacSha256(key, `${PURPOSE}${linkId}\n${expiresAt}\n${passcodeHash}`);
}

export function signUnlock(linkId: string, passcodeHash: string, expiresAt: number, key: string): string {
  return `${expiresAt}.${mac(linkId, expiresAt, passcodeHash, key).toString("base64url")}`;
}

export function verifyUnlock(value: string | undefined, linkId: string, passcodeHash: string, key: string, nowMs: number): boolean {
  if (!value) return false;
  const m = /^(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(value);
  if (!m) return false;
  const expiresAt = Number(m[1]);
  if (nowMs > expiresAt * 1000) return false;
  // text comparison: see media-grant.ts on base64url's spare bits
  return sameBytes(Buffer.from(m[2], "utf8"), Buffer.from(mac(linkId, expiresAt, passcodeHash, key).toString("base64url"), "utf8"));
}
