// Content-Length on responses that Next passes on. Next 16 drops `content-length` from every route
// handler's Response (FORBIDDEN_HEADERS in next/dist/server/send-response.js: a body it may have
// decoded on the way must not keep its old length), so a media file would always go out chunked and
// a player could not learn its size from a plain GET. A handler that knows its body's exact length
// also sends it under a private name; installContentLengthCarrier() (instrumentation.ts) turns that
// back into Content-Length on the Node response, so the private name never reaches the client.
// Where a compressing layer changes the body, it removes Content-Length itself, as for any response.
import http from "node:http";

export const LENGTH_CARRIER = "x-cairn-content-length";

/** Content-Length of a body of `bytes`, for a direct caller and, through the carrier, for Next. */
export function contentLengthHeaders(bytes: number): Record<string, string> {
  return { "Content-Length": String(bytes), [LENGTH_CARRIER]: String(bytes) };
}

const g = globalThis as unknown as { __cairnLengthCarrier?: boolean };

export function installContentLengthCarrier(): void {
  if (g.__cairnLengthCarrier) return;
  g.__cairnLengthCarrier = true;
  const proto = http.ServerResponse.prototype as unknown as {
    setHeader: (name: string, value: unknown) => unknown;
    appendHeader: (name: string, value: unknown) => unknown;
  };
  const setHeader = proto.setHeader;
  const appendHeader = proto.appendHeader;
  const carried = (name: unknown) => typeof name === "string" && name.toLowerCase() === LENGTH_CARRIER;
  proto.setHeader = function (this: http.ServerResponse, name: string, value: unknown) {
    return setHeader.call(this, carried(name) ? "content-length" : name, value);
  };
  proto.appendHeader = function (this: http.ServerResponse, name: string, value: unknown) {
    return carried(name) ? setHeader.call(this, "content-length", value) : appendHeader.call(this, name, value);
  };
}
