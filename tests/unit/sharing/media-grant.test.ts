import { describe, expect, it } from "vitest";
import { hmacSha256 } from "@/lib/sharing/hmac";
import { grantExpiry, MEDIA_GRANT_TTL_S, signMediaGrant, verifyMediaGrant, type MediaGrant } from "@/lib/sharing/media-grant";
import { signUnlock, verifyUnlock } from "@/lib/sharing/unlock-grant";

const KEY = "test-signing-key-0123456789";
const LINK = "0b0e1c5e-8f1a-4d8e-9a43-6f1f0c2b7a11";
const REC = "5a3c2d1e-0f9b-4a8c-b7d6-e5f4a3b2c1d0";
const NOW = Date.UTC(2026, 2, 14, 9, 30, 0);

const grant = (over: Partial<MediaGrant> = {}): MediaGrant => ({ linkId: LINK, kind: "playable", resourceId: REC, expiresAt: grantExpiry(NOW), ...over });

describe("HMAC-SHA-256", () => {
  // RFC 4231 section 4.2, test case 1: key 0x0b x 20, data "Hi There"
  it("matches RFC 4231 test case 1", () => {
    expect(hmacSha256(Buffer.alloc(20, 0x0b), "Hi There").toString("hex")).toBe("b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7");
  });
  // RFC 4231 section 4.3, test case 2: key "Jefe", data "what do ya want for nothing?"
  it("matches RFC 4231 test case 2", () => {
    expect(hmacSha256("Jefe", "what do ya want for nothing?").toString("hex")).toBe("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
  });
});

describe("signed media grants", () => {
  it("round-trip: the grant names link, kind, resource and expiry", () => {
    const signed = signMediaGrant(grant(), KEY);
    expect(signed).toMatch(/^[A-Za-z0-9_-]+\.[A-Za-z0-9_-]{43}$/);
    expect(verifyMediaGrant(signed, KEY, NOW)).toEqual({ ok: true, grant: grant() });
  });

  it("expire: good up to the expiry second, refused after it", () => {
    const signed = signMediaGrant(grant(), KEY);
    const expiryMs = (Math.floor(NOW / 1000) + MEDIA_GRANT_TTL_S) * 1000;
    expect(verifyMediaGrant(signed, KEY, expiryMs).ok).toBe(true);
    expect(verifyMediaGrant(signed, KEY, expiryMs + 1)).toEqual({ ok: false, reason: "expired" });
  });

  it("refuse another key", () => {
    expect(verifyMediaGrant(signMediaGrant(grant(), KEY), `${KEY}x`, NOW)).toEqual({ ok: false, reason: "bad-signature" });
  });

  it("refuse a payload edited to name another file, kind or a later expiry", () => {
    const signed = signMediaGrant(grant(), KEY);
    const [, mac] = signed.split(".");
    const edits: MediaGrant[] = [
      grant({ resourceId: "6b4d3e2f-1a0c-4b9d-8e7f-a6b5c4d3e2f1" }),
      grant({ kind: "original" }),
      grant({ expiresAt: grantExpiry(NOW) + 86_400 }),
      grant({ linkId: "1c1f2d6f-9a2b-4e9f-8b54-7a2a1d3c8b22" }),
    ];
    for (const g of edits) {
      const forgedPayload = signMediaGrant(g, "attacker-key").split(".")[0];
      expect(verifyMediaGrant(`${forgedPayload}.${mac}`, KEY, NOW)).toEqual({ ok: false, reason: "bad-signature" });
    }
  });

  it("refuse a truncated or flipped signature", () => {
    const signed = signMediaGrant(grant(), KEY);
    const last = signed.at(-1) === "A" ? "B" : "A";
    expect(verifyMediaGrant(signed.slice(0, -1) + last, KEY, NOW).ok).toBe(false);
    expect(verifyMediaGrant(signed.slice(0, -4), KEY, NOW).ok).toBe(false);
  });

  it.each([["" ], ["nodot"], ["a.b.c"], ["a b.c"], ["x".repeat(2000)]])("refuse malformed input %#", (value) => {
    const r = verifyMediaGrant(value, KEY, NOW);
    expect(r.ok).toBe(false);
  });

  it("refuse a well-signed payload that is not a grant", () => {
    // signed with the real key and the real label, but the JSON lacks the fields: still refused
    const payload = Buffer.from(JSON.stringify({ l: LINK, k: "everything", r: REC, e: 9e9 })).toString("base64url");
    const mac = hmacSha256(KEY, `cairn/share-media/v1\n${payload}`).toString("base64url");
    expect(verifyMediaGrant(`${payload}.${mac}`, KEY, NOW)).toEqual({ ok: false, reason: "malformed" });
  });

  it("cannot be used as a passcode unlock and the other way round (different purpose labels)", () => {
    const unlock = signUnlock(LINK, "$2b$12$hash", Math.floor(NOW / 1000) + 60, KEY);
    expect(verifyMediaGrant(unlock, KEY, NOW).ok).toBe(false);
    const signed = signMediaGrant(grant(), KEY);
    expect(verifyUnlock(signed, LINK, "$2b$12$hash", KEY, NOW)).toBe(false);
  });
});

describe("passcode unlock values", () => {
  const exp = Math.floor(NOW / 1000) + 3600;
  it("round-trip for the same link and passcode hash", () => {
    expect(verifyUnlock(signUnlock(LINK, "hash-a", exp, KEY), LINK, "hash-a", KEY, NOW)).toBe(true);
  });
  it("do not open another link, survive a new passcode, or outlive their expiry", () => {
    const v = signUnlock(LINK, "hash-a", exp, KEY);
    expect(verifyUnlock(v, "1c1f2d6f-9a2b-4e9f-8b54-7a2a1d3c8b22", "hash-a", KEY, NOW)).toBe(false);
    expect(verifyUnlock(v, LINK, "hash-b", KEY, NOW)).toBe(false);
    expect(verifyUnlock(v, LINK, "hash-a", KEY, exp * 1000 + 1)).toBe(false);
    expect(verifyUnlock(`${exp + 999}.${v.split(".")[1]}`, LINK, "hash-a", KEY, NOW)).toBe(false);
    expect(verifyUnlock(undefined, LINK, "hash-a", KEY, NOW)).toBe(false);
  });
});

describe("signature spelling", () => {
  it("accepts only the one canonical base64url spelling of a MAC (the last letter's spare bits must be zero)", () => {
    const signed = signMediaGrant(grant(), KEY);
    const [payload, mac] = signed.split(".");
    const alphabet = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";
    const last = alphabet.indexOf(mac.at(-1)!);
    // RFC 4648 section 5: 32 bytes are 43 letters; the last letter's low 2 bits are padding
    for (let spare = 1; spare < 4; spare++) {
      const sibling = mac.slice(0, -1) + alphabet[(last & ~3) | spare];
      expect(Buffer.from(sibling, "base64url").equals(Buffer.from(mac, "base64url"))).toBe(true); // same bytes...
      expect(verifyMediaGrant(`${payload}.${sibling}`, KEY, NOW).ok).toBe(false); // ...still refused
    }
  });
});
