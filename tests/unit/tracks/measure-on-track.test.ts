import g from "geographiclib-geodesic";
import { describe, expect, it } from "vitest";
import { describeAlignment, offsetFromFrameMatch, overlap, proposeOffset } from "@/lib/tracks/align-track";
import { measureMoment, takeOffIndex } from "@/lib/tracks/load-flight-track";
import { MAX_GAP_MS, trackPositionAt } from "@/lib/tracks/track-position-at";
import type { TrackPoint } from "@/lib/tracks/track-types";

const T0 = Date.UTC(2026, 2, 14, 10, 0, 0);
// invented points near the invented demo tower site (db/seed/demo-scenario.ts)
const LAUNCH = { lat: 54.41301, lon: -2.61955 };
const track: TrackPoint[] = [
  { t: T0, lat: 54.41301, lon: -2.61955, h: 0 },
  { t: T0 + 1000, lat: 54.41301, lon: -2.61955, h: 5 },
  { t: T0 + 2000, lat: 54.41401, lon: -2.61955, h: 30 },
  { t: T0 + 10_000, lat: 54.41501, lon: -2.61955, h: 40 },
];

describe("position at a moment of the track", () => {
  it("interpolates linearly between the two points around it", () => {
    const at = trackPositionAt(track, T0 + 1500);
    expect(at).toMatchObject({ ok: true, lat: 54.41351, lon: -2.61955, h: 17.5 });
    expect(trackPositionAt(track, T0 + 2000)).toMatchObject({ ok: true, lat: 54.41401, h: 30, nearest: 2, nearestMs: 0 });
  });
  it("refuses moments outside the track and inside gaps longer than the limit", () => {
    expect(trackPositionAt(track, T0 - 1)).toMatchObject({ ok: false });
    expect(trackPositionAt(track, T0 + 10_001)).toMatchObject({ ok: false });
    expect(MAX_GAP_MS).toBeLessThan(8000);
    const gap = trackPositionAt(track, T0 + 5000);
    expect(gap.ok).toBe(false);
    expect(!gap.ok && gap.reason).toBe("in a gap of 8.0 s between track points 3 and 4");
  });
  it("finds the take-off: the last point within 0.5 m of the launch before the first one 2 m above it", () => {
    expect(takeOffIndex(track)).toBe(0);
    const ground = [0, 0.5, 1, 5, 9].map((h, i) => ({ t: T0 + i * 1000, lat: LAUNCH.lat, lon: LAUNCH.lon, h }));
    expect(takeOffIndex(ground)).toBe(1);
    expect(takeOffIndex(ground.map((p) => ({ ...p, h: null })))).toBeNull();
  });
});

describe("distance, height and slant range at a moment (GeographicLib as reference)", () => {
  const rec = { id: "r", name: "VID.h264", state: "ready" as const, fps: 30, durationSec: 10, startMs: T0 - 3000, endMs: T0 + 7000, intervals: null };

  it("matches GeographicLib's WGS84 inverse and a meridian arc worked by hand", () => {
    // recording second 5 at offset 0 is track time T0 + 2 s: the point 0.001 degrees north of the launch
    const m = measureMoment(track, LAUNCH, rec, 5, 0);
    expect(m.trackTime).toBe("2026-03-14T10:00:02.000Z");
    const ref = g.Geodesic.WGS84.Inverse(LAUNCH.lat, LAUNCH.lon, 54.41401, -2.61955);
    expect(Math.abs(m.position!.groundDistanceM - ref.s12!)).toBeLessThan(1e-8);
    // By hand: along a meridian, s = M * dphi with M = a(1 - e^2) / (1 - e^2 sin^2 phi)^1.5 at the mid
    // latitude (standard ellipsoid geometry; WGS84 a = 6378137 m, f = 1/298.257223563, NIMA TR8350.2)
    const a = 6378137;
    const f = 1 / 298.257223563;
    const e2 = f * (2 - f);
    const phi = ((54.41301 + 54.41401) / 2) * (Math.PI / 180);
    const M = (a * (1 - e2)) / Math.pow(1 - e2 * Math.sin(phi) ** 2, 1.5);
    expect(m.position!.groundDistanceM).toBeCloseTo(M * 0.001 * (Math.PI / 180), 4);
    expect(m.position!.heightM).toBe(30);
    // slant range = sqrt(ground^2 + height^2) (Pythagoras)
    expect(m.position!.slantRangeM).toBeCloseTo(Math.hypot(ref.s12!, 30), 9);
    expect(m.position!.bearingDeg).toBeCloseTo(0, 6);
  });

  it("says why there is no position: no file time, outside the track", () => {
    expect(measureMoment(track, LAUNCH, { ...rec, startMs: null }, 5, 0)).toMatchObject({ position: null, reason: expect.stringMatching(/no file time/) });
    expect(measureMoment(track, LAUNCH, rec, 0, 0)).toMatchObject({ position: null, reason: expect.stringMatching(/outside the track/) });
  });
});

describe("alignment of the recorder's clock with the track's", () => {
  const trackSpan = { startMs: T0, endMs: T0 + 600_000 };
  it("proposes no offset when the file times already fall inside the track", () => {
    expect(proposeOffset([{ id: "a", startMs: T0 + 60_000, endMs: T0 + 120_000 }], trackSpan)).toMatchObject({ offsetMs: 0, overlapMs: 60_000 });
  });
  it("finds a recorder set to another time zone (here UTC+05:45, a quarter-hour zone)", () => {
    const shift = (5 * 60 + 45) * 60_000;
    const p = proposeOffset([{ id: "a", startMs: T0 + 60_000 + shift, endMs: T0 + 120_000 + shift }], trackSpan);
    expect(p.offsetMs).toBe(-shift);
    expect(p.overlapMs).toBe(60_000);
  });
  it("reports no overlap when none of the candidate offsets reaches the track", () => {
    const far = 20 * 3_600_000;
    const p = proposeOffset([{ id: "a", startMs: T0 + far, endMs: T0 + far + 1000 }], trackSpan);
    expect(p.overlapMs).toBe(0);
    expect(overlap([{ id: "a", startMs: T0 + far, endMs: T0 + far + 1000 }], trackSpan, p.offsetMs)).toBe(0);
  });
  it("a frame matched to a point gives the offset, uncertain by half a frame plus half the point spacing", () => {
    // recording starts at 10:00:00 on the recorder's clock; frame 90 at 30 fps is 3 s in; the point is at 10:00:40.5
    const m = offsetFromFrameMatch({ recordingStartMs: T0, frame: 90, fps: 30, pointTimeMs: T0 + 40_500, prevPointMs: T0 + 40_400, nextPointMs: T0 + 40_600 });
    expect(m.offsetMs).toBe(37_500);
    expect(m.uncertaintyMs).toBeCloseTo(500 / 30 + 50, 9);
    expect(describeAlignment({ method: "frame_match", uncertaintyMs: m.uncertaintyMs }, 30)).toMatch(/^Matched by the pilot \(± 0\.07 s, about 2\.0 frames\)/);
    expect(describeAlignment({ method: "file_times", uncertaintyMs: 2000 }, 30)).toMatch(/^Rough/);
  });
});
