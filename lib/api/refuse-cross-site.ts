// Cross-site request forgery guard for every state-changing API request (POST, PUT, PATCH, DELETE).
//
// A browser tells us where a request comes from in two headers a page cannot forge: `Origin`
// (RFC 6454 section 7; the Fetch standard sends it on every request whose method is not GET/HEAD)
// and `Sec-Fetch-Site` (W3C Fetch Metadata Request Headers). A request is refused (403) when
//   - Sec-Fetch-Site is present and is neither "same-origin" nor "none" ("same-site" is refused
//     too: another port of the same host is the same site but another origin), or
//   - Origin is present and is not one of the app's own origins, or
//   - Origin is "null" (sandboxed frames, data: pages) and there is no Sec-Fetch-Site to vouch for
//     it. A page served with `Referrer-Policy: no-referrer` (the share pages) sends `Origin: null`
//     even on its own same-origin posts (Fetch standard, "append a request Origin header"); its
//     browser also sends Sec-Fetch-Site: same-origin, which lets it through.
// A request with neither header does not come from a browser, and so carries no cookie a browser
// attached on someone else's behalf: it goes on to the session check like any other.
// The same design is Go's net/http CrossOriginProtection (Go 1.25).
//
// The app's own origins: the configured APP_URL and NEXTAUTH_URL (what people type, also behind a
// reverse proxy that rewrites Host), and the origin the request was addressed to (scheme of the
// request URL + Host). A browser always sends the Host of the URL it loads, so a page on
// http://localhost:8080 posting to http://localhost:3100 sends Origin http://localhost:8080 and Host
// localhost:3100 and is refused; the same app reached as http://127.0.0.1:3100 still works.
//
// Bodies: JSON only (415 otherwise), so a cross-site HTML form (text/plain, urlencoded, multipart)
// can never be parsed as an API call even if an origin check were missed. A request that carries no
// body (no Content-Length or 0, no Transfer-Encoding) needs no Content-Type. Callers with their own
// protocol (tus: application/offset+octet-stream; the analytics beacon: text/plain) check the origin
// only.
import "server-only";
import { ApiError } from "./errors";
import { env } from "@/lib/config/env";

export const STATE_CHANGING_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export function isStateChanging(method: string): boolean {
  return STATE_CHANGING_METHODS.has(method.toUpperCase());
}

function ownOrigins(req: Request): Set<string> {
  const out = new Set<string>();
  const e = env();
  for (const url of [e.APP_URL, process.env.NEXTAUTH_URL]) {
    if (!url) continue;
    try {
      out.add(new URL(url).origin);
    } catch {
      // a malformed NEXTAUTH_URL adds nothing
    }
  }
  const host = req.headers.get("host");
  const protocol = new URL(req.url).protocol;
  if (host) out.add(`${protocol}//${host}`.toLowerCase());
  out.add(new URL(req.url).origin);
  return out;
}

const CROSS_SITE = "Cross-site requests are not accepted: send this request from Cairn's own pages";

/** Throws a 403 ApiError when the request was sent by a page on another origin. */
export function assertSameOrigin(req: Request): void {
  const site = req.headers.get("sec-fetch-site")?.trim().toLowerCase();
  if (site && site !== "same-origin" && site !== "none") throw new ApiError("forbidden", CROSS_SITE);
  const origin = req.headers.get("origin")?.trim().toLowerCase();
  if (!origin) return;
  if (origin === "null") {
    if (site === "same-origin" || site === "none") return;
    throw new ApiError("forbidden", CROSS_SITE);
  }
  if (!ownOrigins(req).has(origin)) throw new ApiError("forbidden", CROSS_SITE);
}

/**
 * True when the request carries a body: a declared non-zero length or a chunked one. An HTTP/1.1
 * request with neither Content-Length nor Transfer-Encoding has no body (RFC 9112 section 6.3).
 */
function hasBody(req: Request): boolean {
  if (req.headers.get("transfer-encoding")) return true;
  const length = req.headers.get("content-length");
  return length !== null && length.trim() !== "0";
}

/** Throws a 415 ApiError unless the body is JSON (or there is no body at all). */
export function assertJsonBody(req: Request): void {
  const type = req.headers.get("content-type");
  if (type === null) {
    if (hasBody(req)) throw new ApiError("unsupported_media_type", "Send the request body as application/json");
    return;
  }
  const essence = type.split(";")[0].trim().toLowerCase();
  if (essence !== "application/json") throw new ApiError("unsupported_media_type", "Send the request body as application/json");
}

/** The whole guard for a JSON API request: origin first (403), then the body type (415). */
export function refuseCrossSite(req: Request, body: "json" | "own-protocol" = "json"): void {
  if (!isStateChanging(req.method)) return;
  assertSameOrigin(req);
  if (body === "json") assertJsonBody(req);
}
