import { describe, expect, it } from "vitest";
import { generateShareToken, hashShareToken, looksLikeShareToken, SHARE_TOKEN_BYTES } from "@/lib/sharing/share-token";

describe("share tokens", () => {
  it("carry at least 128 random bits, written as unpadded base64url (RFC 4648 section 5)", () => {
    expect(SHARE_TOKEN_BYTES * 8).toBeGreaterThanOrEqual(128);
    const t = generateShareToken();
    expect(t).toMatch(/^[A-Za-z0-9_-]+$/);
    // RFC 4648 section 5 alphabet decodes back to exactly the bytes drawn
    expect(Buffer.from(t, "base64url")).toHaveLength(SHARE_TOKEN_BYTES);
    expect(Buffer.from(t, "base64url").toString("base64url")).toBe(t);
    expect(looksLikeShareToken(t)).toBe(true);
  });

  it("do not repeat over many draws and use the whole alphabet", () => {
    const seen = new Set<string>();
    const chars = new Set<string>();
    for (let i = 0; i < 2000; i++) {
      const t = generateShareToken();
      seen.add(t);
      for (const c of t) chars.add(c);
    }
    expect(seen.size).toBe(2000);
    // 2000 x 43 characters from a uniform 64-letter alphabet leave none unused (the chance of a
    // miss is about 64 * (63/64)^86000, far below 1e-500)
    expect(chars.size).toBe(64);
  });

  it("are stored as the SHA-256 of their text (FIPS 180-4 example: 'abc')", () => {
    // FIPS 180-4 (NIST example; docs/outside-checks.md): SHA-256("abc")
    expect(hashShareToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    const t = generateShareToken();
    expect(hashShareToken(t)).toMatch(/^[0-9a-f]{64}$/);
    expect(hashShareToken(t)).not.toContain(t);
  });

  it.each([
    ["empty", ""],
    ["too short", "abc"],
    ["one character too long", "A".repeat(44)],
    ["padding", `${"A".repeat(42)}=`],
    ["standard base64 letters", `${"A".repeat(42)}+`],
    ["path traversal", "../../../../etc/passwd"],
    ["not a string", 42],
  ])("refuse the shape of %s", (_label, value) => {
    expect(looksLikeShareToken(value)).toBe(false);
  });
});
