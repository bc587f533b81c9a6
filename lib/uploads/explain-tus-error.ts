// @tus/server answers its own protocol errors with short plain-text bodies. This maps them to our
// JSON error shape with a sentence a pilot can act on; our own refusals pass through unchanged.
import { ERRORS } from "@tus/server";
import { type ErrorCode, ERROR_STATUS } from "@/lib/api/errors";
import { formatBytes } from "./format-bytes";
import { UploadRefusal } from "./upload-refusal";
import { describeErrorForLog } from "@/lib/api/describe-error-for-log";
import { isServiceUnavailable } from "@/lib/api/service-unavailable";

type TusError = { status_code: number; body: string };

const json = (code: ErrorCode, message: string, status = ERROR_STATUS[code]): TusError => ({
  status_code: status,
  body: JSON.stringify({ error: { code, message } }),
});

export function explainTusError(err: Error | TusError, maxBytes: number): TusError | undefined {
  if (err instanceof UploadRefusal) return undefined;
  const e = err as Partial<TusError>;
  switch (e.body) {
    case ERRORS.FILE_NOT_FOUND.body:
      return json("not_found", "Upload not found");
    case ERRORS.FILE_NO_LONGER_EXISTS.body:
      return json("gone", "This upload has expired or its data is gone; add the file again to start over");
    case ERRORS.INVALID_OFFSET.body:
      return json("conflict", "Upload-Offset does not match the bytes the server holds; ask with HEAD and continue from that offset");
    case ERRORS.ERR_MAX_SIZE_EXCEEDED.body:
      return json("payload_too_large", `The file is larger than the ${formatBytes(maxBytes)} limit for one upload`);
    case ERRORS.ERR_SIZE_EXCEEDED.body:
      return json("payload_too_large", "More bytes were sent than the upload's declared Upload-Length");
    case ERRORS.INVALID_METADATA.body:
      return json("bad_request", "Upload-Metadata is malformed: it must be comma-separated pairs of a key and a Base64 value, each key once");
    case ERRORS.INVALID_LENGTH.body:
      return json("bad_request", "Send exactly one of Upload-Length or Upload-Defer-Length, with a valid number");
    case ERRORS.MISSING_OFFSET.body:
      return json("bad_request", "Upload-Offset header required");
    case ERRORS.INVALID_CONTENT_TYPE.body:
      return json("unsupported_media_type", "PATCH requests need Content-Type: application/offset+octet-stream");
    case ERRORS.INVALID_TERMINATION.body:
      return json("conflict", "A finished upload cannot be cancelled: its recording is stored or being stored");
    case ERRORS.ABORTED.body:
      return json("bad_request", "The request was interrupted; the upload can continue from the server's offset");
  }
  if (typeof e.status_code === "number" && e.status_code < 500 && typeof e.body === "string") {
    return { status_code: e.status_code, body: JSON.stringify({ error: { code: "bad_request", message: e.body.trim() } }) };
  }
  if (isServiceUnavailable(err)) {
    console.warn(`[uploads] service unavailable: ${describeErrorForLog(err)}`);
    return json("unavailable", "Cairn cannot reach its database right now. The bytes already received are kept: the upload continues from there once it is back.");
  }
  if (e.body === ERRORS.FILE_WRITE_ERROR.body || e.body === ERRORS.ERR_LOCK_TIMEOUT.body) console.warn("[uploads]", e.body.trim());
  else console.error(`[uploads] unexpected error: ${describeErrorForLog(err)}`);
  return json("internal", "Something went wrong on our side; retrying continues the upload from the bytes already received", 500);
}
