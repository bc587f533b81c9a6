// The state of a share link at a moment: revoked wins over expired, because revocation is the
// sender's deliberate act and the page should say so.
export type ShareLinkStatus = "active" | "expired" | "revoked";

export function shareLinkStatus(link: { revokedAt: Date | null; expiresAt: Date }, now: Date = new Date()): ShareLinkStatus {
  if (link.revokedAt) return "revoked";
  if (link.expiresAt.getTime() <= now.getTime()) return "expired";
  return "active";
}

// Words first; the symbol repeats the word for a glance, never replaces it (WCAG 2.2 SC 1.4.1; docs/look.md).
export const SHARE_STATUS_LABELS: Record<ShareLinkStatus, { label: string; symbol: string; meaning: string }> = {
  active: { label: "Active", symbol: "●", meaning: "Opens for anyone holding the link (and the passcode, if set)." },
  expired: { label: "Expired", symbol: "◌", meaning: "Past its expiry: the link and every media address under it are refused." },
  revoked: { label: "Revoked", symbol: "⊘", meaning: "Withdrawn by your organisation: refused from the next request on." },
};
