// A refusal of the upload endpoint, thrown from the tus hooks: @tus/server answers with its
// `status_code` and `body`. The body is our usual JSON error shape, so the uploader shows the
// message the same way as for every other API answer.
import { ERROR_STATUS, type ErrorCode } from "@/lib/api/errors";

export class UploadRefusal extends Error {
  readonly status_code: number;
  readonly body: string;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
    this.name = "UploadRefusal";
    this.status_code = ERROR_STATUS[code];
    this.body = JSON.stringify({ error: { code, message, ...(fields ? { fields } : {}) } });
  }
}
