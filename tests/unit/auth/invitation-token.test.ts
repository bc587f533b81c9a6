import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { INVITATION_LIFETIME_MS, INVITATION_TOKEN_BYTES, hashInvitationToken, newInvitationToken } from "@/lib/members/invitation-token";
import { INVITATION_TOKEN_PATTERN, invitationToken } from "@/lib/validation/members";

describe("invitation tokens", () => {
  it("carry at least 128 random bits (here 256) in URL-safe base64 (RFC 4648 section 5)", () => {
    expect(INVITATION_TOKEN_BYTES * 8).toBeGreaterThanOrEqual(128);
    const t = newInvitationToken();
    expect(t).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(Buffer.from(t, "base64url")).toHaveLength(INVITATION_TOKEN_BYTES);
    expect(INVITATION_TOKEN_PATTERN.test(t)).toBe(true);
    expect(invitationToken.safeParse(t).success).toBe(true);
  });

  it("do not repeat", () => {
    const seen = new Set(Array.from({ length: 1000 }, newInvitationToken));
    expect(seen.size).toBe(1000);
  });

  it("are stored as SHA-256 hex", () => {
    // FIPS 180-4 example: SHA-256("abc")
    expect(hashInvitationToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    const t = newInvitationToken();
    expect(hashInvitationToken(t)).toBe(createHash("sha256").update(t).digest("hex"));
  });

  it("live for 7 days", () => {
    expect(INVITATION_LIFETIME_MS).toBe(7 * 24 * 60 * 60 * 1000);
  });
});
