// Who is watching when a beacon comes from a shared page: no account, but the page's player sends
// the signed address of the recording it plays (the "playable" media grant) as the view's access
// token. The view counts for that share link only if the signature is ours, the grant is for this
// recording, the link is still open and still shows it. Grants live 10 minutes while a view can
// last longer, so for analytics a grant is accepted for a while after its expiry.
import "server-only";
import { and, eq, isNotNull } from "drizzle-orm";
import { db } from "@/db/client";
import { playbackViews } from "@/db/schema";
import { env } from "@/lib/config/env";
import { verifyMediaGrant } from "@/lib/sharing/media-grant";
import { resolveShareLinkById } from "@/lib/sharing/resolve-share-link";
import { resolveScopedFile } from "@/lib/sharing/resolve-scoped-file";

export const SHARE_BEACON_GRACE_MS = 6 * 3600_000; // 6 h: a long viewing session, not a replay a day later

export type ShareViewer = { organisationId: string; shareLinkId: string };

export async function shareViewerOf(accessToken: string, recordingId: string, now = new Date()): Promise<ShareViewer | null> {
  // checking as of (now - grace) accepts a grant that expired less than the grace ago
  const check = verifyMediaGrant(accessToken, env().MEDIA_SIGNING_KEY, now.getTime() - SHARE_BEACON_GRACE_MS);
  if (!check.ok || check.grant.kind !== "playable" || check.grant.resourceId !== recordingId) return null;
  const resolved = await resolveShareLinkById(check.grant.linkId, now);
  if (resolved.kind !== "open") return null;
  if (!(await resolveScopedFile(resolved.link, "playable", recordingId))) return null;
  return { organisationId: resolved.link.organisationId, shareLinkId: resolved.link.id };
}

/**
 * The share link of a view that an earlier beacon already proved: mux-embed sends custom fields such
 * as the access token only in a view's first event and leaves out unchanged fields after it, so a
 * later beacon of the same view carries its view id (always sent) but no token. The view id is a
 * random id only that page knows; the link must still be open.
 */
export async function knownShareViewer(viewKey: string, recordingId: string, now = new Date()): Promise<ShareViewer | null> {
  const [row] = await db()
    .select({ shareLinkId: playbackViews.shareLinkId })
    .from(playbackViews)
    .where(and(eq(playbackViews.viewKey, viewKey), eq(playbackViews.recordingId, recordingId), isNotNull(playbackViews.shareLinkId)))
    .limit(1);
  if (!row?.shareLinkId) return null;
  const resolved = await resolveShareLinkById(row.shareLinkId, now);
  if (resolved.kind !== "open") return null;
  return { organisationId: resolved.link.organisationId, shareLinkId: resolved.link.id };
}
