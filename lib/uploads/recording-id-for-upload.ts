// The recording id of an upload is derived from the upload id, not drawn at random: if the server
// dies after the original was placed at its store key but before the row was committed, the next
// attempt finds the placed file under the same key and completes the commit instead of leaving
// an orphan.
import { createHash } from "node:crypto";

/** A UUID (RFC 9562 version 8, "custom") from the SHA-256 of the tus upload id. */
export function recordingIdForUpload(uploadId: string): string {
  const b = createHash("sha256").update(`cairn-recording:${uploadId}`).digest().subarray(0, 16);
  b[6] = (b[6] & 0x0f) | 0x80; // version 8
  b[8] = (b[8] & 0x3f) | 0x80; // variant 10xx
  const hex = b.toString("hex");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}
