// The import's JSON body, read with a limit: a declared length over the limit is refused before a byte
// is read (413), and a body without a declared length is counted as it arrives and cut off at the limit,
// so a 200 MB upload never fills the server's memory. The file's name travels in the query (?name=) as
// well, so even a refusal before the body is read can name the file.
import { ApiError } from "@/lib/api/errors";
import { formatMiB } from "./parse-track";
import { MAX_TRACK_BYTES } from "./track-types";

/** Base64 grows 4/3; a little room for the JSON around it and the file name. */
export const MAX_IMPORT_BODY_BYTES = Math.ceil(MAX_TRACK_BYTES / 3) * 4 + 4096;

export async function readTrackBody(req: Request): Promise<unknown> {
  const name = (new URL(req.url).searchParams.get("name") ?? "the track file").replace(/[\u0000-\u001f\u007f]/g, "").slice(0, 255) || "the track file";
  const tooLarge = (size: number | null) =>
    new ApiError("payload_too_large", `${name}: the file is ${size === null ? "larger than that" : `about ${formatMiB((size * 3) / 4)}`}; a track may be at most ${formatMiB(MAX_TRACK_BYTES)}. Nothing was saved.`);
  const declared = Number(req.headers.get("content-length") ?? "NaN");
  if (Number.isFinite(declared) && declared > MAX_IMPORT_BODY_BYTES) throw tooLarge(declared);
  if (!req.body) throw new ApiError("bad_request", "The request has no body");
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > MAX_IMPORT_BODY_BYTES) {
      await reader.cancel().catch(() => {});
      throw tooLarge(null);
    }
    chunks.push(value);
  }
  try {
    return JSON.parse(Buffer.concat(chunks).toString("utf8"));
  } catch {
    throw new ApiError("bad_request", "The request body is not valid JSON");
  }
}
