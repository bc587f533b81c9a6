// One error class, one code-to-status table, one JSON body shape for every API answer that fails.
import { ZodError } from "zod";
import { isServiceUnavailable, RETRY_AFTER_SECONDS, UNAVAILABLE_MESSAGE } from "./service-unavailable";
import { describeErrorForLog } from "./describe-error-for-log";
import { fieldErrors } from "@/lib/validation/field-errors";

export { fieldErrors };

export const ERROR_STATUS = {
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  gone: 410,
  payload_too_large: 413,
  unsupported_media_type: 415,
  range_not_satisfiable: 416,
  unprocessable: 422,
  locked: 423,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;
export type ErrorCode = keyof typeof ERROR_STATUS;

export type ErrorBody = { error: { code: ErrorCode; message: string; fields?: Record<string, string[]> } };

export class ApiError extends Error {
  constructor(
    public readonly code: ErrorCode,
    message: string,
    public readonly fields?: Record<string, string[]>,
  ) {
    super(message);
    this.name = "ApiError";
  }
  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export const notFound = (what = "Not found") => new ApiError("not_found", what);

export function errorBody(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof ApiError) {
    return { status: err.status, body: { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } } };
  }
  if (err instanceof ZodError) {
    return { status: 422, body: { error: { code: "unprocessable", message: "Some fields are not valid", fields: fieldErrors(err) } } };
  }
  if (isServiceUnavailable(err)) return { status: 503, body: { error: { code: "unavailable", message: UNAVAILABLE_MESSAGE } } };
  return { status: 500, body: { error: { code: "internal", message: "Something went wrong on our side. Nothing was saved." } } };
}

export function errorResponse(err: unknown): Response {
  const { status, body } = errorBody(err);
  // never the error object itself: a failed query's bound parameters ride on it
  if (status === 503) {
    console.warn(`[cairn] service unavailable: ${describeErrorForLog(err)}`);
    return Response.json(body, { status, headers: { "Cache-Control": "no-store", "Retry-After": String(RETRY_AFTER_SECONDS) } });
  }
  if (status >= 500) console.error(`[cairn] unexpected error: ${describeErrorForLog(err)}`);
  return Response.json(body, { status, headers: { "Cache-Control": "no-store" } });
}
