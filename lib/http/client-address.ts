// The address a request came from, as far as this server can prove it.
//
// Next 16 route handlers get a web Request with no socket, and `next start` only fills in
// `X-Forwarded-For` with the socket address when the client did not send one (base-server.ts:
// `req.headers['x-forwarded-for'] ??= socket.remoteAddress`), so that header is whatever a client
// wants it to be. The web server therefore stamps the real socket address on every request itself,
// in the PEER_HEADER (lib/http/install-peer-address.ts, installed from instrumentation.ts), replacing
// any value a client sent under that name.
//
// `X-Forwarded-For` is read only behind TRUSTED_PROXY_HOPS proxies of our own (default 0: never):
// each trusted proxy appends the address it received the request from, so the client is the entry
// that many places from the right of [...X-Forwarded-For, socket address]; anything further left was
// written by the client and is ignored. Common practice (RFC 7239 section 7.4 on forged values; the
// same rule as Express's "trust proxy" hop count).
import "server-only";
import { env } from "@/lib/config/env";

export const PEER_HEADER = "x-cairn-peer-address";
/** What a request that did not pass through our server's socket hook is counted under. */
export const UNKNOWN_ADDRESS = "unknown";

type HeaderSource = Headers | Record<string, unknown> | undefined | null;

function header(h: HeaderSource, name: string): string | null {
  if (!h) return null;
  if (h instanceof Headers) return h.get(name);
  const v = h[name] ?? h[name.toLowerCase()];
  return typeof v === "string" ? v : Array.isArray(v) ? v.join(",") : null;
}

/** IPv4-mapped IPv6 (::ffff:192.0.2.1) is the IPv4 address; anything else as it came. */
const normal = (a: string) => a.trim().replace(/^::ffff:(\d+\.\d+\.\d+\.\d+)$/i, "$1").toLowerCase();

export function clientAddress(h: HeaderSource, hops: number = env().TRUSTED_PROXY_HOPS): string {
  const peer = header(h, PEER_HEADER)?.trim();
  if (!peer) return UNKNOWN_ADDRESS;
  if (hops <= 0) return normal(peer);
  const forwarded = (header(h, "x-forwarded-for") ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const chain = [...forwarded, peer];
  return normal(chain[Math.max(0, chain.length - 1 - hops)]);
}
