// The original of a recording, byte for byte, as a download: Content-Disposition attachment with
// the pilot's file name (RFC 6266), no content sniffing, and its SHA-256 in the response headers
// (RFC 9530 Repr-Digest, and as hex for people comparing with sha256sum). Each GET is a custody
// event. The bytes are hashed again on their way out: if the stored file no longer matches its
// recorded hash, the transfer is broken off instead of completing with altered bytes.
import "server-only";
import { contentLengthHeaders } from "@/lib/http/content-length-carrier";
import { Readable, Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import { createHash } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, requestFacts } from "@/lib/custody/record-custody-event";
import { buildContentDisposition } from "@/lib/http/build-content-disposition";
import { readKey, statKey } from "@/lib/storage/store";
import type { RecordingKind } from "../uploads/sniff-content";

const MEDIA_TYPES: Record<RecordingKind, string> = {
  // RFC 6184 registers video/H264 for RTP payloads, not for Annex B files: an opaque download is honest
  raw_h264: "application/octet-stream",
  mp4: "video/mp4",
  mov: "video/quicktime",
  jpeg: "image/jpeg",
};

/** RFC 9530 section 3: Repr-Digest: sha-256=:<base64 of the digest bytes>: */
export function reprDigest(sha256Hex: string): string {
  return `sha-256=:${Buffer.from(sha256Hex, "hex").toString("base64")}:`;
}

function verifying(expectedHex: string, expectedSize: number, recordingId: string): Transform {
  const hash = createHash("sha256");
  let bytes = 0;
  return new Transform({
    transform(chunk: Buffer, _enc, cb) {
      hash.update(chunk);
      bytes += chunk.length;
      cb(null, chunk);
    },
    flush(cb) {
      const hex = hash.digest("hex");
      if (hex !== expectedHex || bytes !== expectedSize) {
        console.error(`[originals] stored original of ${recordingId} does not match its record: ${bytes} bytes, sha256 ${hex}`);
        cb(new Error("stored original does not match its recorded SHA-256"));
        return;
      }
      cb();
    },
  });
}

export async function serveOriginal(req: Request, member: Member, recordingId: string): Promise<Response> {
  const [row] = await db()
    .select({ id: recordings.id, jobId: recordings.jobId, originalName: recordings.originalName, kind: recordings.kind, sha256: recordings.sha256, sizeBytes: recordings.sizeBytes, storageKey: recordings.storageKey })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, member.organisationId), isNull(recordings.deletedAt)));
  if (!row) throw notFound("Recording not found");
  const stored = row.storageKey ? await statKey(row.storageKey) : null;
  if (!stored || stored.size !== row.sizeBytes) {
    console.error(`[originals] original of ${row.id} is ${stored ? `${stored.size} bytes, expected ${row.sizeBytes}` : "missing"} at ${row.storageKey}`);
    throw new ApiError("internal", "The original of this recording is missing from the store or has the wrong size. Nothing was sent; tell the owner.");
  }
  const headers = new Headers({
    "Content-Type": MEDIA_TYPES[row.kind],
    ...contentLengthHeaders(row.sizeBytes),
    "Content-Disposition": buildContentDisposition(row.originalName),
    "X-Content-Type-Options": "nosniff",
    "Repr-Digest": reprDigest(row.sha256),
    "Cairn-Original-SHA256": row.sha256,
    "Cache-Control": "private, no-store",
    "Accept-Ranges": "none",
  });
  if (req.method === "HEAD") return new Response(null, { status: 200, headers });

  await recordCustodyEvent({
    organisationId: member.organisationId,
    eventType: "download",
    evidenceType: "recording",
    evidenceId: row.id,
    jobId: row.jobId,
    originalSha256: row.sha256,
    originalSize: row.sizeBytes,
    actor: { userId: member.userId, role: member.role },
    ...requestFacts(req),
    storageLocation: row.storageKey,
    purpose: "original download",
  });
  const body = verifying(row.sha256, row.sizeBytes, row.id);
  // errors on either side destroy both (a reader that goes away, a store that fails mid-read)
  pipeline(readKey(row.storageKey!), body).catch(() => {});
  return new Response(Readable.toWeb(body) as ReadableStream<Uint8Array>, { status: 200, headers });
}
