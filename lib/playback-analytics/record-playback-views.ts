// Stores view figures, one row per view (the SDK's view id), updated by every later beacon of that
// view. A beacon may only add to a view of the same organisation, recording and viewer: a guessed or
// replayed view id cannot overwrite someone else's row.
import "server-only";
import { and, eq, inArray, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { playbackViews, recordings } from "@/db/schema";
import { uuid } from "@/lib/validation/common";
import type { ViewFigures } from "./read-beacons";


export type Viewer = { organisationId: string; userId: string | null; shareLinkId: string | null };

export async function recordPlaybackViews(viewer: Viewer, views: ViewFigures[]): Promise<{ stored: number; ignored: number }> {
  const candidates = views.filter((v) => uuid.safeParse(v.recordingId).success);
  const ids = [...new Set(candidates.map((v) => v.recordingId))];
  const known = ids.length
    ? new Set(
        (
          await db()
            .select({ id: recordings.id })
            .from(recordings)
            .where(and(inArray(recordings.id, ids), eq(recordings.organisationId, viewer.organisationId), isNull(recordings.deletedAt)))
        ).map((r) => r.id),
      )
    : new Set<string>();
  let stored = 0;
  for (const v of candidates) {
    if (!known.has(v.recordingId)) continue;
    const rows = await db()
      .insert(playbackViews)
      .values({
        organisationId: viewer.organisationId,
        recordingId: v.recordingId,
        viewKey: v.viewKey,
        viewerUserId: viewer.userId,
        shareLinkId: viewer.shareLinkId,
        startedAt: v.startedAt,
        lastBeaconAt: v.lastBeaconAt,
        watchTimeMs: v.watchTimeMs,
        startupTimeMs: v.startupTimeMs,
        rebufferCount: v.rebufferCount,
        rebufferMs: v.rebufferMs,
      })
      .onConflictDoUpdate({
        target: playbackViews.viewKey,
        set: {
          startedAt: sql`least(${playbackViews.startedAt}, excluded.started_at)`,
          lastBeaconAt: sql`greatest(${playbackViews.lastBeaconAt}, excluded.last_beacon_at)`,
          watchTimeMs: sql`greatest(${playbackViews.watchTimeMs}, excluded.watch_time_ms)`,
          startupTimeMs: sql`coalesce(greatest(${playbackViews.startupTimeMs}, excluded.startup_time_ms), ${playbackViews.startupTimeMs}, excluded.startup_time_ms)`,
          rebufferCount: sql`greatest(${playbackViews.rebufferCount}, excluded.rebuffer_count)`,
          rebufferMs: sql`greatest(${playbackViews.rebufferMs}, excluded.rebuffer_ms)`,
          updatedAt: sql`now()`,
        },
        setWhere: sql`${playbackViews.organisationId} = excluded.organisation_id and ${playbackViews.recordingId} = excluded.recording_id and ${playbackViews.viewerUserId} is not distinct from excluded.viewer_user_id and ${playbackViews.shareLinkId} is not distinct from excluded.share_link_id`,
      })
      .returning({ id: playbackViews.id });
    stored += rows.length;
  }
  return { stored, ignored: views.length - stored };
}
