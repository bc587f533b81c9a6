// SHA-256 (FIPS 180-4) of a byte stream, hashed as the bytes arrive: an original of several GB
// is never held in memory, and the digest equals a one-shot hash of the same bytes.
import { createHash } from "node:crypto";

export interface StreamDigest {
  /** lowercase hex SHA-256 */
  readonly hex: string;
  /** bytes hashed */
  readonly bytes: number;
}

/**
 * Hashes a Node Readable (or any async iterable of byte chunks).
 * String chunks are refused: a stream with an encoding set yields decoded text, and hashing text
 * re-encoded as UTF-8 would not be a hash of the original bytes.
 */
export async function sha256OfStream(source: AsyncIterable<unknown>): Promise<StreamDigest> {
  const hash = createHash("sha256");
  let bytes = 0;
  for await (const chunk of source) {
    if (!(chunk instanceof Uint8Array)) {
      throw new TypeError(`expected byte chunks (Buffer/Uint8Array), got ${typeof chunk === "string" ? "a string (is an encoding set on the stream?)" : typeof chunk}`);
    }
    hash.update(chunk);
    bytes += chunk.byteLength;
  }
  return { hex: hash.digest("hex"), bytes };
}
