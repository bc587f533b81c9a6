// Verifies a custody log's hash chain and names the FIRST event where it breaks.
//
// At each position i (events in chain order):
//   prev-mismatch: the event's prevHash is not the hash of the event before it (genesis zeros at 0).
//                  Catches a removed, inserted or reordered event.
//   hash-mismatch: the event's stored hash is not chainHash(prevHash, canonical payload).
//                  Catches an event whose content was altered after it was sealed.
// An event altered AND re-sealed shows up one position later, as prev-mismatch of its successor;
// rewriting the whole tail is only caught against a head hash kept elsewhere (compare `headHash`).
//
// Streaming: ChainVerifier takes events one at a time, so a caller can feed it from a database
// cursor in batches (verifyChainStream) without holding the whole log in memory.
import { canonicalSerialize } from "./canonical-serialize";
import { chainHash, GENESIS_HASH } from "./chain-hash";
import { custodyPayloadOf, type ChainedRecord } from "./custody-payload";

export type ChainBreakReason = "hash-mismatch" | "prev-mismatch";

export type ChainVerification =
  | { readonly ok: true; readonly count: number; readonly headHash: string }
  | { readonly ok: false; readonly brokenAt: number; readonly eventId: string; readonly reason: ChainBreakReason };

export interface VerifyChainOptions<E extends ChainedRecord> {
  /** hash of the event before the first one fed; default genesis (verifying from the start) */
  readonly previousHash?: string | null;
  /** position of the first event fed, for verifying a later segment; default 0 */
  readonly startIndex?: number;
  /** which part of an event is hashed; default every field except prevHash and hash */
  readonly payloadOf?: (event: E) => unknown;
}

export class ChainVerifier<E extends ChainedRecord> {
  private expectedPrev: string;
  private index: number;
  private readonly startIndex: number;
  private readonly payloadOf: (event: E) => unknown;
  private failure: Extract<ChainVerification, { ok: false }> | null = null;

  constructor(options: VerifyChainOptions<E> = {}) {
    this.expectedPrev = options.previousHash ?? GENESIS_HASH;
    this.startIndex = options.startIndex ?? 0;
    this.index = this.startIndex;
    this.payloadOf = options.payloadOf ?? custodyPayloadOf;
  }

  /** Checks the next event; returns false once the chain is broken (further events are ignored). */
  push(event: E): boolean {
    if (this.failure) return false;
    const prevHash = event.prevHash ?? GENESIS_HASH;
    if (prevHash !== this.expectedPrev) {
      this.failure = { ok: false, brokenAt: this.index, eventId: event.id, reason: "prev-mismatch" };
      return false;
    }
    const recomputed = chainHash(prevHash, canonicalSerialize(this.payloadOf(event)));
    if (recomputed !== event.hash) {
      this.failure = { ok: false, brokenAt: this.index, eventId: event.id, reason: "hash-mismatch" };
      return false;
    }
    this.expectedPrev = event.hash;
    this.index++;
    return true;
  }

  result(): ChainVerification {
    return this.failure ?? { ok: true, count: this.index - this.startIndex, headHash: this.expectedPrev };
  }
}

export function verifyChain<E extends ChainedRecord>(events: Iterable<E>, options?: VerifyChainOptions<E>): ChainVerification {
  const verifier = new ChainVerifier<E>(options);
  for (const event of events) if (!verifier.push(event)) break;
  return verifier.result();
}

/** Accepts events one by one or in batches (arrays), e.g. pages read from a database cursor. */
export async function verifyChainStream<E extends ChainedRecord>(
  source: AsyncIterable<E | readonly E[]> | Iterable<E | readonly E[]>,
  options?: VerifyChainOptions<E>,
): Promise<ChainVerification> {
  const verifier = new ChainVerifier<E>(options);
  // Leaving the loop early calls the source's return(), which closes a cursor behind it.
  outer: for await (const item of source) {
    const batch: readonly E[] = Array.isArray(item) ? item : [item as E];
    for (const event of batch) if (!verifier.push(event)) break outer;
  }
  return verifier.result();
}
