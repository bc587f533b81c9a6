// What of a stored custody event the chain hash covers: every field except the two chain fields.
// prevHash enters through the chain formula itself (chain-hash.ts); hash is the result.
// Whoever stores events must therefore store exactly the fields that were hashed (a database
// default filled in after hashing would break verification), and read them back unchanged.

export interface ChainedRecord {
  readonly id: string;
  /** previous event's hash; null or 64 zeros for the first event */
  readonly prevHash: string | null;
  readonly hash: string;
}

export function custodyPayloadOf<E extends ChainedRecord>(event: E): Record<string, unknown> {
  const { prevHash: _prevHash, hash: _hash, ...payload } = event;
  return payload;
}
