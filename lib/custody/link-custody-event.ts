// Seals a new custody event onto the chain: the only way new events should get their hashes.
import { canonicalSerialize } from "./canonical-serialize";
import { chainHash, GENESIS_HASH } from "./chain-hash";

export function linkCustodyEvent<P extends { readonly id: string }>(
  previousHash: string | null,
  payload: P,
): P & { prevHash: string; hash: string } {
  if ("prevHash" in payload || "hash" in payload) throw new TypeError("payload must not carry prevHash or hash");
  const prevHash = previousHash ?? GENESIS_HASH;
  return { ...payload, prevHash, hash: chainHash(prevHash, canonicalSerialize(payload)) };
}
