// Playback analytics for a video.js player: videojs-mux, loaded on demand, posting its beacons to
// the app's own collector (/api/collector) and never to a hosted service. A viewer is either the
// signed-in member (the collector reads the session) or, on a shared page, the page's signed media
// address sent as the view's access token (custom_1), which names the share link.
import type videojs from "video.js";
import { beaconCollectionDomain } from "@/lib/playback-analytics/beacon-collection-domain";

type Player = ReturnType<typeof videojs>;

export type PlaybackAnalytics = {
  recordingId: string;
  title: string;
  playerName: string;
  viewerUserId?: string;
  accessToken?: string;
};

/** Starts analytics on `player` unless `stillWanted()` says the player was disposed meanwhile. */
export function attachPlaybackAnalytics(player: Player, analytics: PlaybackAnalytics, stillWanted: () => boolean): void {
  const domain = beaconCollectionDomain(window.location);
  if (!domain) return;
  void import("videojs-mux").then(() => {
    const withMux = player as Player & { mux?: (options: unknown) => void };
    if (!stillWanted() || typeof withMux.mux !== "function") return;
    withMux.mux({
      debug: false,
      beaconCollectionDomain: domain,
      data: {
        env_key: "cairn-local",
        player_name: analytics.playerName,
        video_id: analytics.recordingId,
        video_title: analytics.title,
        ...(analytics.viewerUserId ? { viewer_user_id: analytics.viewerUserId } : {}),
        ...(analytics.accessToken ? { custom_1: analytics.accessToken } : {}),
      },
    });
  });
}
