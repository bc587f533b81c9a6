import { describe, expect, it } from "vitest";
import { readBeacons, BeaconError } from "@/lib/playback-analytics/read-beacons";

const rec = "7b0d3f1e-3f4c-4c55-9b8a-0d7c0e7a1f00";
const t0 = Date.UTC(2026, 2, 14, 9, 0, 0);

describe("readBeacons", () => {
  it("keeps the largest cumulative figures per view, whatever the order of events", () => {
    const views = readBeacons({
      metadata: { transmission_timestamp: t0 },
      events: [
        { e: "viewstart", xid: "v1", vid: rec, xst: t0, uti: t0 },
        { e: "hb", xid: "v1", vid: rec, uti: t0 + 10_000, xwati: 9_500, xtitofifr: 420, xreco: 1, xredu: 300 },
        // a late, older heartbeat must not lower anything
        { e: "hb", xid: "v1", vid: rec, uti: t0 + 5_000, xwati: 4_000, xreco: 0, xredu: 0 },
        { e: "viewend", xid: "v1", vid: rec, uti: t0 + 12_000, xwati: 11_800 },
      ],
    });
    expect(views).toHaveLength(1);
    expect(views[0]).toMatchObject({ viewKey: "v1", recordingId: rec, watchTimeMs: 11_800, startupTimeMs: 420, rebufferCount: 1, rebufferMs: 300 });
    expect(views[0].startedAt.getTime()).toBe(t0);
    expect(views[0].lastBeaconAt.getTime()).toBe(t0 + 12_000);
  });

  it("separates views, skips events without a view or video id, and ignores a view switching videos", () => {
    const views = readBeacons({
      events: [
        { e: "hb", xid: "a", vid: rec, xwati: 100 },
        { e: "hb", xid: "b", vid: rec, xwati: 200 },
        { e: "hb", vid: rec, xwati: 999 },
        { e: "hb", xid: "a", vid: "another-video", xwati: 5000 },
        "not an object",
      ],
    });
    expect(views.map((v) => [v.viewKey, v.watchTimeMs])).toEqual([
      ["a", 100],
      ["b", 200],
    ]);
  });

  it("refuses what is not a beacon", () => {
    expect(() => readBeacons(null)).toThrow(BeaconError);
    expect(() => readBeacons({ events: "x" })).toThrow(BeaconError);
    expect(() => readBeacons({ events: new Array(5000).fill({}) })).toThrow(BeaconError);
  });
});
