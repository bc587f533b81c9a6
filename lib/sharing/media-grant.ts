// Short-lived signed addresses for the files behind a share link.
//
// A grant names one file: the link it was issued under, the kind of file and the id of the record
// that holds it, and an expiry. It is written `<payload>.<mac>`, both base64url, where the MAC is
// HMAC-SHA-256 over a purpose label and the payload text, so a grant can never pass for any other
// signed value of ours. The signature only proves that we issued the address; the media route still
// re-reads the link and its scope on every request (including each Range request), so a revoked or
// expired link stops its addresses at once.
import { hmacSha256, sameBytes } from "./hmac";

export const MEDIA_GRANT_KINDS = ["playable", "poster", "sprite", "thumbnails", "still", "original", "report"] as const;
export type MediaGrantKind = (typeof MEDIA_GRANT_KINDS)[number];

/** Kinds that are saved as files by the client: each fetch of one counts as a download. */
export const DOWNLOAD_KINDS: ReadonlySet<MediaGrantKind> = new Set(["original", "report"]);

export const MEDIA_GRANT_TTL_S = 10 * 60; // 10 min: long enough to start a download, short enough to leak little

export type MediaGrant = {
  readonly linkId: string;
  readonly kind: MediaGrantKind;
  readonly resourceId: string;
  /** Unix time, seconds */
  readonly expiresAt: number;
};

export type GrantCheck =
  | { readonly ok: true; readonly grant: MediaGrant }
  | { readonly ok: false; readonly reason: "malformed" | "bad-signature" | "expired" };

const PURPOSE = "cairn/share-media/v1\n";
const B64URL = /^[A-Za-z0-9_-]+$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

function mac(payload: string, key: string): Buffer {
  return hmacSha256(key, PURPOSE + payload);
}

export function signMediaGrant(grant: MediaGrant, key: string): string {
  if (!UUID.test(grant.linkId) || !UUID.test(grant.resourceId)) throw new TypeError("grant ids must be UUIDs");
  if (!MEDIA_GRANT_KINDS.includes(grant.kind)) throw new TypeError(`unknown grant kind ${grant.kind}`);
  if (!Number.isSafeInteger(grant.expiresAt)) throw new TypeError("grant expiry must be whole seconds");
  const payload = Buffer.from(JSON.stringify({ l: grant.linkId, k: grant.kind, r: grant.resourceId, e: grant.expiresAt }), "utf8").toString("base64url");
  return `${payload}.${mac(payload, key).toString("base64url")}`;
}

export function grantExpiry(nowMs: number, ttlS = MEDIA_GRANT_TTL_S): number {
  return Math.floor(nowMs / 1000) + ttlS;
}

/** Checks the MAC before reading anything out of the payload. */
export function verifyMediaGrant(value: string, key: string, nowMs: number): GrantCheck {
  if (typeof value !== "string" || value.length > 1024) return { ok: false, reason: "malformed" };
  const parts = value.split(".");
  if (parts.length !== 2 || !B64URL.test(parts[0]) || !B64URL.test(parts[1])) return { ok: false, reason: "malformed" };
  const [payload, signature] = parts;
  // compare the text, not decoded bytes: base64url's last letter carries 2 spare bits a decoder
  // drops, so decoding would accept 4 spellings of one signature
  if (!sameBytes(Buffer.from(signature, "utf8"), Buffer.from(mac(payload, key).toString("base64url"), "utf8"))) return { ok: false, reason: "bad-signature" };
  let data: { l?: unknown; k?: unknown; r?: unknown; e?: unknown };
  try {
    data = JSON.parse(Buffer.from(payload, "base64url").toString("utf8"));
  } catch {
    return { ok: false, reason: "malformed" };
  }
  const { l, k, r, e } = data ?? {};
  if (typeof l !== "string" || !UUID.test(l) || typeof r !== "string" || !UUID.test(r)) return { ok: false, reason: "malformed" };
  if (typeof k !== "string" || !(MEDIA_GRANT_KINDS as readonly string[]).includes(k)) return { ok: false, reason: "malformed" };
  if (typeof e !== "number" || !Number.isSafeInteger(e)) return { ok: false, reason: "malformed" };
  // an address is good up to and including its expiry second
  if (nowMs > e * 1000) return { ok: false, reason: "expired" };
  return { ok: true, grant: { linkId: l, kind: k as MediaGrantKind, resourceId: r, expiresAt: e } };
}
