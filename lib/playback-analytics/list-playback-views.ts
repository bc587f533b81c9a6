// A recording's views for its page: who (member or share link), when, and how playback went.
import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { playbackViews, recordings, shareLinks, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";

export async function listPlaybackViews(organisationId: string, recordingId: string) {
  const [rec] = await db().select({ id: recordings.id }).from(recordings).where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId)));
  if (!rec) throw notFound("Recording not found");
  const items = await db()
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
    })
    .from(playbackViews)
    .leftJoin(users, eq(users.id, playbackViews.viewerUserId))
    .leftJoin(shareLinks, and(eq(shareLinks.id, playbackViews.shareLinkId), eq(shareLinks.organisationId, organisationId)))
    .where(and(eq(playbackViews.organisationId, organisationId), eq(playbackViews.recordingId, recordingId)))
    .orderBy(desc(playbackViews.startedAt))
    .limit(200);
  return { items, total: items.length };
}
