// Telling "a service we depend on is down" from a bug. A PostgreSQL that is stopped, crashed or
// restarting (and a Redis that is away) makes every query fail with a connection error: the right
// answer is 503 Service Unavailable with Retry-After (RFC 9110 sections 15.6.4 and 10.2.3), a sentence
// that says what is wrong, and nothing written, not a 500. Recovery needs no restart: postgres.js and
// ioredis open new connections on the next request once the service is back.

// socket errors (Node), postgres.js connection errors, and SQLSTATE classes 08 (connection exception)
// and 57P (operator intervention: admin_shutdown, crash_shutdown, cannot_connect_now), PostgreSQL
// documentation, appendix A "PostgreSQL Error Codes"
const CONNECTION_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "CONNECTION_CLOSED", "CONNECTION_ENDED", "CONNECTION_DESTROYED", "CONNECT_TIMEOUT"]);
const MAX_DEPTH = 5;

export const RETRY_AFTER_SECONDS = 5;
export const UNAVAILABLE_MESSAGE = "Cairn cannot reach its database or job queue right now, so nothing was saved. Try again in a moment.";

export function isServiceUnavailable(err: unknown): boolean {
  let e = err as { code?: unknown; cause?: unknown; errors?: unknown; message?: unknown } | undefined;
  for (let depth = 0; e && typeof e === "object" && depth < MAX_DEPTH; depth++) {
    const code = typeof e.code === "string" ? e.code : "";
    if (CONNECTION_CODES.has(code) || code.startsWith("57P0") || /^08\d{3}$/.test(code)) return true;
    // an AggregateError of failed connection attempts (IPv4 and IPv6 to the same host)
    if (Array.isArray(e.errors) && e.errors.some((x) => isServiceUnavailable(x))) return true;
    if (typeof e.message === "string" && /^Connection is closed\.?$/.test(e.message)) return true; // ioredis
    e = e.cause as typeof e;
  }
  return false;
}
