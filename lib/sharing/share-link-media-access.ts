// The share-link mode of the review room's media authorization (lib/media-access): lets the
// /api/media/** routes serve a file to a signed share-link address given as ?token=<grant>.
// Same rules as our own /api/s/media route: the grant's signature and expiry, then the link's
// revocation and expiry read fresh (every Range request), then the file must be the very one the
// grant names and still inside the link's scope; anything else is "not found".
// To enable it, add it to MEDIA_ACCESS_MODES in lib/media-access/media-access-modes.ts.
import { ApiError } from "@/lib/api/errors";
import { env } from "@/lib/config/env";
import type { MediaAccessMode } from "@/lib/media-access/media-access-mode";
import type { MediaFile, MediaPrincipal } from "@/lib/media-access/media-file";
import { DOWNLOAD_KINDS, verifyMediaGrant, type MediaGrant } from "./media-grant";
import { resolveShareLinkById, type ResolvedShareLink } from "./resolve-share-link";
import { resolveScopedFile } from "./resolve-scoped-file";
import { recordShareDownload } from "./record-share-access";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { countsAsDownload } from "@/lib/custody/counts-as-download";

type SharePrincipal = Extract<MediaPrincipal, { type: "share-link" }> & { grant: MediaGrant; link: ResolvedShareLink };

const RENDITION_GRANTS = new Set(["playable", "poster", "sprite", "thumbnails"]);

function grantNames(grant: MediaGrant, file: MediaFile): boolean {
  switch (file.kind) {
    case "rendition":
      return RENDITION_GRANTS.has(grant.kind) && file.recordingId === grant.resourceId;
    case "still":
      return grant.kind === "still" && file.id === grant.resourceId;
    case "report":
      return grant.kind === "report" && file.reportId === grant.resourceId;
  }
}

export const shareLinkMediaAccess: MediaAccessMode = {
  name: "share-link",
  applies: (c) => c.token !== null,
  async principal(c): Promise<MediaPrincipal> {
    const now = Date.now();
    const check = verifyMediaGrant(c.token ?? "", env().MEDIA_SIGNING_KEY, now);
    if (!check.ok) throw new ApiError("unauthenticated", check.reason === "expired" ? "This media address has expired. Reload the shared page." : "This media address is not valid");
    const resolved = await resolveShareLinkById(check.grant.linkId, new Date(now));
    if (resolved.kind === "unknown") throw new ApiError("unauthenticated", "This media address is not valid");
    if (resolved.kind === "gone") throw new ApiError("gone", resolved.reason === "revoked" ? "This share link has been revoked." : "This share link has expired.");
    const principal: SharePrincipal = { type: "share-link", organisationId: resolved.link.organisationId, shareLinkId: resolved.link.id, grant: check.grant, link: resolved.link };
    return principal;
  },
  async mayOpen(p, file) {
    if (p.type !== "share-link" || !("grant" in p)) return false;
    const { grant, link } = p as SharePrincipal;
    if (file.organisationId !== link.organisationId || !grantNames(grant, file)) return false;
    const scoped = await resolveScopedFile(link, grant.kind, grant.resourceId);
    return scoped !== null && scoped.storageKey === file.storageKey;
  },
  async onServed(p, _file, c, res) {
    const { grant, link } = p as SharePrincipal;
    if (!DOWNLOAD_KINDS.has(grant.kind) || !countsAsDownload(c.req.method, res.status, res.headers.get("content-range"))) return;
    const scoped = await resolveScopedFile(link, grant.kind, grant.resourceId);
    if (scoped) await recordShareDownload(link, scoped, requestFacts(c.req)).catch(() => {});
  },
};
