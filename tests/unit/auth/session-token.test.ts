// readSession opens next-auth's session token itself, with the encryption key derived once per secret
// (lib/auth/read-session.ts). Reference: next-auth 4's own `encode` and `decode` (next-auth/jwt, the
// library that signs people in): every token either both accept with the same claims, or both refuse.
import { describe, expect, it } from "vitest";
import { decode, encode } from "next-auth/jwt";
import { decodeSessionToken } from "@/lib/auth/read-session";

const secret = "a-test-secret-of-at-least-thirty-two-characters";
const claims = { uid: "5d3c3f3e-6c2b-4d4e-9a34-0d7c2f4f9b11", org: "0e9d7a5c-1b2a-4c3d-8e9f-112233445566", sid: "9f8e7d6c-5b4a-4321-8765-43210fedcba9", sub: "5d3c3f3e-6c2b-4d4e-9a34-0d7c2f4f9b11" };

/** next-auth's decode, as a result instead of a throw */
async function reference(token: string, key: string) {
  try {
    return { ok: true, payload: await decode({ token, secret: key }) };
  } catch {
    return { ok: false };
  }
}
async function ours(token: string, key: string) {
  try {
    return { ok: true, payload: await decodeSessionToken(token, key) };
  } catch {
    return { ok: false };
  }
}

describe("decodeSessionToken agrees with next-auth's decode", () => {
  it("reads a fresh token's claims", async () => {
    const token = await encode({ token: claims, secret });
    const [a, b] = [await reference(token, secret), await ours(token, secret)];
    expect(b).toEqual(a);
    expect(b.ok).toBe(true);
    expect(b.payload).toMatchObject(claims);
  });

  it("allows the same 15 s of clock skew, and refuses a token expired longer ago", async () => {
    const justExpired = await encode({ token: claims, secret, maxAge: -5 });
    expect(await ours(justExpired, secret)).toEqual(await reference(justExpired, secret));
    expect((await ours(justExpired, secret)).ok).toBe(true);
    const expired = await encode({ token: claims, secret, maxAge: -60 });
    expect(await reference(expired, secret)).toEqual({ ok: false });
    expect(await ours(expired, secret)).toEqual({ ok: false });
  });

  it("refuses a token changed by one character, and one made with another secret", async () => {
    const token = await encode({ token: claims, secret });
    const parts = token.split(".");
    const body = parts[3];
    parts[3] = (body[0] === "A" ? "B" : "A") + body.slice(1); // the ciphertext
    const tampered = parts.join(".");
    expect(await reference(tampered, secret)).toEqual({ ok: false });
    expect(await ours(tampered, secret)).toEqual({ ok: false });
    const foreign = await encode({ token: claims, secret: `${secret}-other` });
    expect(await reference(foreign, secret)).toEqual({ ok: false });
    expect(await ours(foreign, secret)).toEqual({ ok: false });
  });

  it("derives the key again when the secret changes", async () => {
    const other = `${secret}-rotated`;
    await ours(await encode({ token: claims, secret }), secret);
    const token = await encode({ token: claims, secret: other });
    expect((await ours(token, other)).ok).toBe(true);
    expect(await ours(token, secret)).toEqual({ ok: false });
  });
});
