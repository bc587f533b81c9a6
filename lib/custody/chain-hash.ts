// One link of the custody log's hash chain:
//   hash = lowercase hex SHA-256 over UTF-8( prevHash + "\n" + canonical )
// where prevHash is the previous event's hash, or 64 zeros for the first event (genesis).
// The newline keeps the two parts apart: the hex side never contains one, so no choice of
// canonical text can shift bytes across the boundary.
import { createHash } from "node:crypto";

export const GENESIS_HASH = "0".repeat(64);

const HEX_SHA256 = /^[0-9a-f]{64}$/;

export function isSha256Hex(value: unknown): value is string {
  return typeof value === "string" && HEX_SHA256.test(value);
}

export function chainHash(prevHash: string | null, canonical: string): string {
  const previous = prevHash ?? GENESIS_HASH;
  if (!isSha256Hex(previous)) throw new TypeError(`previous hash must be 64 lowercase hex digits, got ${JSON.stringify(prevHash)}`);
  return createHash("sha256").update(`${previous}\n${canonical}`, "utf8").digest("hex");
}
