// Whether a stopped upload is a refusal (the server looked at the file or its metadata and will
// answer the same way every time: sending it again cannot help) or a stop that retrying may cure
// (the link dropped, the session ended, the server was busy or unreachable).
// The statuses are Cairn's own error answers (lib/api/errors.ts, lib/uploads/upload-refusal.ts):
// 400 bad request, 403 forbidden, 413 too large, 415 wrong content type and 422 unprocessable
// (wrong kind of file, empty, flight not found, quota) are refusals. 401 (sign in again), 404 and
// 410 (the partial upload is gone: add the file again), 408, 409 (offset mismatch), 423 (being
// stored), 429 and every 5xx or network stop are not. RFC 9110 section 15.5 describes the 4xx class.
export type UploadFailure = { kind: "refused"; reason: string } | { kind: "stopped"; reason: string };

const REFUSAL_STATUSES = new Set([400, 403, 413, 415, 422]);

export function classifyUploadFailure(status: number | undefined, serverMessage: string | null, fallback: string): UploadFailure {
  if (status !== undefined && REFUSAL_STATUSES.has(status) && serverMessage) return { kind: "refused", reason: serverMessage };
  return { kind: "stopped", reason: serverMessage ?? fallback };
}
