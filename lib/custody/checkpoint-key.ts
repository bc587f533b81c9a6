// The installation's custody signing key: an Ed25519 key pair (RFC 8032) made from the 32-byte seed in
// CUSTODY_SIGNING_KEY (base64url; lib/config/env.ts keeps it outside the database). The database holds
// only the public key, so someone who can write to the database cannot sign a checkpoint.
import "server-only";
import { createHash, createPrivateKey, createPublicKey, sign, verify, type KeyObject } from "node:crypto";
import { env } from "@/lib/config/env";

// PKCS#8 PrivateKeyInfo for Ed25519 up to the seed (RFC 8410 section 7): SEQUENCE { version 0,
// AlgorithmIdentifier { 1.3.101.112 }, OCTET STRING { OCTET STRING (32 bytes) } }
const PKCS8_ED25519_PREFIX = Buffer.from("302e020100300506032b657004220420", "hex");
// SubjectPublicKeyInfo for Ed25519 up to the 32-byte key (RFC 8410 section 4)
const SPKI_ED25519_PREFIX = Buffer.from("302a300506032b6570032100", "hex");

export type CustodySigner = { privateKey: KeyObject; publicKey: string; keyId: string };

export function signerFromSeed(seedBase64url: string): CustodySigner {
  const seed = Buffer.from(seedBase64url, "base64url");
  if (seed.length !== 32) throw new Error("CUSTODY_SIGNING_KEY must be 32 random bytes written as base64url (43 characters)");
  const privateKey = createPrivateKey({ key: Buffer.concat([PKCS8_ED25519_PREFIX, seed]), format: "der", type: "pkcs8" });
  const raw = createPublicKey(privateKey).export({ format: "der", type: "spki" }).subarray(SPKI_ED25519_PREFIX.length);
  return { privateKey, publicKey: raw.toString("base64url"), keyId: keyIdOf(raw.toString("base64url")) };
}

/** A short name for a public key: the first 16 hex digits of SHA-256 over its 32 raw bytes. */
export function keyIdOf(publicKey: string): string {
  return createHash("sha256").update(Buffer.from(publicKey, "base64url")).digest("hex").slice(0, 16);
}

let cached: { seed: string; signer: CustodySigner } | undefined;

/** The signer of this installation (the seed read through env(), made on first use on a local run). */
export function custodySigner(): CustodySigner {
  const seed = env().CUSTODY_SIGNING_KEY;
  if (cached?.seed !== seed) cached = { seed, signer: signerFromSeed(seed) };
  return cached.signer;
}

export function signStatement(signer: CustodySigner, statement: string): string {
  return sign(null, Buffer.from(statement, "utf8"), signer.privateKey).toString("base64url");
}

export function verifyStatement(publicKey: string, statement: string, signature: string): boolean {
  try {
    const key = createPublicKey({ key: Buffer.concat([SPKI_ED25519_PREFIX, Buffer.from(publicKey, "base64url")]), format: "der", type: "spki" });
    return verify(null, Buffer.from(statement, "utf8"), key, Buffer.from(signature, "base64url"));
  } catch {
    return false;
  }
}
