// HMAC-SHA-256 (RFC 2104 with SHA-256, test vectors in RFC 4231) and a constant-time comparison,
// shared by the signed media addresses and the passcode unlock cookie.
import { createHmac, timingSafeEqual } from "node:crypto";

export function hmacSha256(key: string | Buffer, message: string | Buffer): Buffer {
  return createHmac("sha256", key).update(message).digest();
}

/** Constant-time for equal lengths; a length mismatch is refused at once (the length is public). */
export function sameBytes(a: Buffer, b: Buffer): boolean {
  return a.length === b.length && timingSafeEqual(a, b);
}
