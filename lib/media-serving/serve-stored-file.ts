// Answers a GET or HEAD for a stored media file per RFC 9110: 200 with the whole file, 206 with one
// byte range, 416 with "bytes */LENGTH". Private evidence: never stored by shared caches, never
// sniffed into another type.
import { statKey } from "@/lib/storage/store";
import { parseRange } from "@/lib/http/parse-range";
import { buildRangeResponseHeaders } from "@/lib/http/build-range-response-headers";
import { buildContentDisposition, type DispositionType } from "@/lib/http/build-content-disposition";
import { notFound } from "@/lib/api/errors";
import type { MediaFile } from "./media-file";
import { streamStoredFile } from "./stream-stored-file";

export const MEDIA_CACHE_CONTROL = "private, no-store";

export async function serveStoredFile(req: Request, file: MediaFile, disposition: DispositionType = "inline"): Promise<Response> {
  const stat = await statKey(file.storageKey);
  if (!stat) {
    // the row says the file exists: a missing file is a storage fault worth a log line
    console.error(`[cairn] media file missing from the store: ${file.kind} ${file.id}`);
    throw notFound("File not found");
  }
  const etag = file.sha256 ? `"${file.sha256.slice(0, 32)}"` : null;
  const base: Record<string, string> = {
    "Content-Type": file.contentType,
    "Cache-Control": MEDIA_CACHE_CONTROL,
    "X-Content-Type-Options": "nosniff",
    "Content-Disposition": buildContentDisposition(file.downloadName, disposition),
    "Last-Modified": file.updatedAt.toUTCString(),
    ...(etag ? { ETag: etag } : {}),
  };

  // If-Range (RFC 9110 13.1.5): a range applies only while the client's validator still matches.
  const ifRange = req.headers.get("if-range");
  const rangeHeader = ifRange !== null && ifRange !== etag ? null : req.headers.get("range");
  // Range applies to GET only (RFC 9110 14.2); HEAD describes the whole representation.
  const range = req.method === "GET" ? parseRange(rangeHeader, stat.size) : { kind: "full" as const };
  const head = buildRangeResponseHeaders(range, stat.size);
  const headers = { ...base, ...head.headers };

  if (head.status === 416) return new Response(null, { status: 416, headers });
  if (req.method === "HEAD" || stat.size === 0) return new Response(null, { status: head.status, headers });
  const byteRange = range.kind === "partial" ? { start: range.start, end: range.end } : undefined;
  const { stream } = streamStoredFile(file.storageKey, byteRange, req.signal);
  return new Response(stream, { status: head.status, headers });
}
