// When serving a file counts as one download in the custody log (and in a share link's events): a
// GET whose answer carries the representation from its first byte, that is 200 with the whole file
// or 206 whose Content-Range starts at byte 0 (RFC 9110 14.4: "bytes 0-LAST/LENGTH"). A client that
// resumes or a player that seeks asks for later ranges: those are the same download, not new ones.
// HEAD sends no body, 416 sends nothing. Judged on the answer, not on the Range header, so a Range
// the server ignored (invalid, several ranges, a failed If-Range) counts as the full file it sent.

const FROM_BYTE_ZERO = /^bytes 0-\d+\/(\d+|\*)$/;

export function countsAsDownload(method: string, status: number, contentRange: string | null | undefined): boolean {
  if (method !== "GET") return false;
  if (status === 200) return true;
  return status === 206 && FROM_BYTE_ZERO.test((contentRange ?? "").trim());
}
