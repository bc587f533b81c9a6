// Turns one beacon body ({ metadata, events }) into per-view figures. mux-embed's counters are
// cumulative within a view and later beacons may repeat or omit unchanged fields, so each view keeps
// the largest value seen; beacons can arrive out of order, which the same rule absorbs.
import { beaconField } from "./beacon-keys";

export type ViewFigures = {
  viewKey: string;
  recordingId: string;
  startedAt: Date;
  lastBeaconAt: Date;
  watchTimeMs: number;
  startupTimeMs: number | null;
  rebufferCount: number;
  rebufferMs: number;
  /** a share link's media token the player passed along (custom_1), if any */
  accessToken: string | null;
};

export class BeaconError extends Error {}

const MAX_EVENTS = 4000; // mux-embed queues at most 3600 events (maxQueueLength)
const NON_NEGATIVE_INT = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) && v >= 0 ? Math.round(v) : typeof v === "string" && /^\d+(\.\d+)?$/.test(v) ? Math.round(Number(v)) : null);
const PLAUSIBLE_TIME = (ms: number | null) => (ms !== null && ms > 946_684_800_000 && ms < 4_102_444_800_000 ? new Date(ms) : null); // 2000..2100
const SHORT_ID = /^[A-Za-z0-9_-]{1,100}$/;

export function readBeacons(body: unknown, now = new Date()): ViewFigures[] {
  if (!body || typeof body !== "object" || !Array.isArray((body as { events?: unknown }).events)) throw new BeaconError("expected { metadata, events: [...] }");
  const events = (body as { events: unknown[] }).events;
  if (events.length > MAX_EVENTS) throw new BeaconError(`too many events (${events.length})`);
  const views = new Map<string, ViewFigures>();
  for (const raw of events) {
    if (!raw || typeof raw !== "object") continue;
    const e = raw as Record<string, unknown>;
    const viewKey = beaconField(e, "view_id");
    const recordingId = beaconField(e, "video_id");
    if (typeof viewKey !== "string" || !SHORT_ID.test(viewKey) || typeof recordingId !== "string" || recordingId.length > 100) continue;
    const at = PLAUSIBLE_TIME(NON_NEGATIVE_INT(beaconField(e, "viewer_time"))) ?? now;
    const start = PLAUSIBLE_TIME(NON_NEGATIVE_INT(beaconField(e, "view_start")));
    const token = beaconField(e, "custom_1");
    let v = views.get(viewKey);
    if (!v) {
      v = { viewKey, recordingId, startedAt: start ?? at, lastBeaconAt: at, watchTimeMs: 0, startupTimeMs: null, rebufferCount: 0, rebufferMs: 0, accessToken: null };
      views.set(viewKey, v);
    }
    if (v.recordingId !== recordingId) continue; // one view plays one video; a mismatch is not ours to merge
    if (start && start < v.startedAt) v.startedAt = start;
    if (at > v.lastBeaconAt) v.lastBeaconAt = at;
    v.watchTimeMs = Math.max(v.watchTimeMs, NON_NEGATIVE_INT(beaconField(e, "view_watch_time")) ?? 0);
    const startup = NON_NEGATIVE_INT(beaconField(e, "view_time_to_first_frame"));
    if (startup !== null) v.startupTimeMs = v.startupTimeMs === null ? startup : Math.max(v.startupTimeMs, startup);
    v.rebufferCount = Math.max(v.rebufferCount, NON_NEGATIVE_INT(beaconField(e, "view_rebuffer_count")) ?? 0);
    v.rebufferMs = Math.max(v.rebufferMs, NON_NEGATIVE_INT(beaconField(e, "view_rebuffer_duration")) ?? 0);
    if (typeof token === "string" && token.length <= 500) v.accessToken = token;
  }
  return [...views.values()];
}
