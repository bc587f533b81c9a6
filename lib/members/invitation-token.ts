// Invitation tokens: 256 random bits, mailed once, stored only as their SHA-256 so that a copy of the
// database cannot be turned into working invitation links.
import { createHash, randomBytes } from "node:crypto";

export const INVITATION_TOKEN_BYTES = 32; // 256 bits
export const INVITATION_LIFETIME_MS = 7 * 24 * 3600 * 1000; // 7 days

export function newInvitationToken(): string {
  return randomBytes(INVITATION_TOKEN_BYTES).toString("base64url");
}

export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
