// A recording's views for its page: who (member or share link), when, and how playback went; newest
// first, paged by keyset (playback_views_org_recording_idx serves the order). A view with no watch
// time is someone opening the page without playing: the player's analytics report it, and the row is
// kept (its first beacon may carry a share link's token that later beacons lack), but it is not a view
// of the footage, so it is not listed (before, opening a recording listed a "view" of 0.0 s).
import "server-only";
import { and, eq, gt } from "drizzle-orm";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, type KeyPart, type KeysetParams } from "@/lib/api/keyset";
import { db } from "@/db/client";
import { playbackViews, recordings, shareLinks, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";

const KEYS: KeyPart[] = [
  { expr: playbackViews.startedAt, dir: "desc", type: "timestamptz", notNull: true },
  { expr: playbackViews.id, dir: "desc", type: "uuid", notNull: true },
];

export async function listPlaybackViews(organisationId: string, recordingId: string, page: KeysetParams = { pageSize: 200 }) {
  const [rec] = await db().select({ id: recordings.id }).from(recordings).where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId)));
  if (!rec) throw notFound("Recording not found");
  const rows = await db()
    .select({
      id: playbackViews.id,
      viewerName: users.name,
      shareLinkLabel: shareLinks.label,
      startedAt: playbackViews.startedAt,
      lastBeaconAt: playbackViews.lastBeaconAt,
      watchTimeMs: playbackViews.watchTimeMs,
      startupTimeMs: playbackViews.startupTimeMs,
      rebufferCount: playbackViews.rebufferCount,
      rebufferMs: playbackViews.rebufferMs,
      ...keysetColumns(KEYS),
    })
    .from(playbackViews)
    .leftJoin(users, eq(users.id, playbackViews.viewerUserId))
    .leftJoin(shareLinks, and(eq(shareLinks.id, playbackViews.shareLinkId), eq(shareLinks.organisationId, organisationId)))
    .where(and(eq(playbackViews.organisationId, organisationId), eq(playbackViews.recordingId, recordingId), gt(playbackViews.watchTimeMs, 0), afterCursor(page.cursor, "default", KEYS)))
    .orderBy(...keysetOrder(KEYS))
    .limit(page.pageSize + 1);
  const result = pageOfRows(rows, page.pageSize, "default", KEYS);
  // `total` stays for older callers: the number on this page
  return { ...result, total: result.items.length };
}
