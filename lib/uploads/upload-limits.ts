// Sizes and times of the upload path, shared by the server and the uploader in the browser
// (so this file imports nothing). Byte sizes carry their unit in the name or the comment.

/** Where the tus endpoint lives (the route file app/api/uploads/[[...path]]/route.ts). */
export const UPLOAD_ROUTE_PATH = "/api/uploads";

/**
 * Bytes per PATCH sent by the uploader. Bounded, so a reverse proxy in front of the app only needs
 * to accept request bodies of this size (configure it to allow at least this much). A dropped link
 * costs nothing either way: the server keeps the bytes of a PATCH cut off mid-way (staging-store.ts)
 * and the upload resumes from them. Each PATCH costs a fixed ~10 ms (session and membership check,
 * upload record, final fsync, round trip); 16 MiB keeps that near 5% on a fast local network and
 * negligible over a field hotspot (bench/upload-throughput.ts compares sizes).
 */
export const UPLOAD_CHUNK_BYTES = 16 * 1024 * 1024; // 16 MiB

/** Waits between retries of a failed request (ms); long enough to ride out a hotspot dropping for a minute. */
export const UPLOAD_RETRY_DELAYS_MS = [0, 1_000, 3_000, 5_000, 10_000, 20_000, 30_000, 60_000];

/**
 * Bytes read from the start of a file to decide what it is. A controller stream that begins
 * mid-GOP may carry its first SPS only at the next keyframe: at ~0.5 Mbit/s and a 1-2 s keyframe
 * interval that is well inside 1 MiB.
 */
export const SNIFF_BYTES = 1024 * 1024; // 1 MiB

/** An unfinished upload untouched this long is abandoned: the tus expiration extension answers 410, the purge deletes it. */
export const UPLOAD_EXPIRY_MS = 7 * 24 * 3600_000; // 7 days: a pilot may finish at the office days later

/** How long the record of a finished or refused upload is kept, so a client retrying late still learns the outcome. */
export const UPLOAD_TOMBSTONE_TTL_MS = 14 * 24 * 3600_000; // 14 days

/**
 * A file in the originals store with no recording row is only removed after this long, so the
 * purge never races an ingest that has placed its file and is about to commit the row.
 */
export const ORPHAN_GRACE_MS = 24 * 3600_000; // 24 h

/** A complete upload whose commit never ran (server died, response lost) is committed by the purge after this long. */
export const STALLED_INGEST_AFTER_MS = 10 * 60_000; // 10 min
