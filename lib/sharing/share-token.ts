// Share-link tokens: 256 random bits from the OS generator, written base64url (RFC 4648 section 5)
// so they sit in a URL path untouched. Only the SHA-256 of a token is ever stored; the token itself
// lives in the recipient's mail and address bar and nowhere on our side.
import { createHash, randomBytes } from "node:crypto";

export const SHARE_TOKEN_BYTES = 32; // 256 bits; the floor we promise is 128
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/; // 32 bytes in unpadded base64url

export function generateShareToken(): string {
  return randomBytes(SHARE_TOKEN_BYTES).toString("base64url");
}

/** Cheap shape check before any lookup: anything else cannot be one of ours. */
export function looksLikeShareToken(value: unknown): value is string {
  return typeof value === "string" && TOKEN_SHAPE.test(value);
}

/** Lowercase hex SHA-256 of the token's UTF-8 text: the only form the database holds. */
export function hashShareToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
