import { describe, expect, it } from "vitest";
import { frameRateFromFps, recordingTiming } from "@/lib/recordings/recording-frame-rate";

describe("frameRateFromFps", () => {
  // SMPTE ST 12-1: 29.97 and 59.94 are 30000/1001 and 60000/1001 exactly (docs/outside-checks.md, Time)
  it.each([
    [30000 / 1001, { num: 30000, den: 1001 }],
    [29.97, { num: 30000, den: 1001 }],
    [59.94, { num: 60000, den: 1001 }],
    [23.976, { num: 24000, den: 1001 }],
    [25, { num: 25, den: 1 }],
    [30, { num: 30, den: 1 }],
    [50.0001, { num: 50, den: 1 }],
    [12.5, { num: 25, den: 2 }],
  ])("%d fps -> %o", (fps, rate) => {
    expect(frameRateFromFps(fps)).toEqual(rate);
  });

  it("refuses rates that cannot be real", () => {
    for (const v of [0, -30, Number.NaN, Number.POSITIVE_INFINITY, 5000]) expect(() => frameRateFromFps(v)).toThrow(RangeError);
  });
});

describe("recordingTiming", () => {
  it("prefers the pilot's override, then the stream, then the organisation default", () => {
    const facts = { fps: 25, frameCount: 50, durationSec: 2 };
    expect(recordingTiming({ fpsOverride: 30, durationSec: 2, facts }, 24)?.rate).toEqual({ num: 30, den: 1 });
    expect(recordingTiming({ fpsOverride: null, durationSec: 2, facts }, 24)?.rate).toEqual({ num: 25, den: 1 });
    expect(recordingTiming({ fpsOverride: null, durationSec: 2, facts: { frameCount: 48 } }, 24)?.rate).toEqual({ num: 24, den: 1 });
  });

  it("counts frames from the facts, else from duration x rate; unknown timing is null", () => {
    expect(recordingTiming({ fpsOverride: null, durationSec: 2.002, facts: { fps: 30000 / 1001 } }, 30)?.frameCount).toBe(60);
    expect(recordingTiming({ fpsOverride: null, durationSec: null, facts: { fps: 30 } }, 30)).toBeNull();
  });
});

describe("recordingTiming from the stored figures", () => {
  it("counts recorder frame slots (lost included) at the figures' exact rate, and carries the lost count", async () => {
    const { computeRecordingFigures } = await import("@/lib/recordings/recording-figures");
    // 360 slots at 30000/1001, 45 of them lost (a lower bound): the figures decide over facts
    const states = new Uint8Array(360);
    states.fill(2, 100, 145);
    const figures = computeRecordingFigures({ frameRate: { num: 30000, den: 1001 }, states, rendition: "reencode", framesLostIsLowerBound: true });
    const t = recordingTiming({ fpsOverride: null, durationSec: 10.5, facts: { fps: 30, frameCount: 315 }, figures }, 24)!;
    expect(t.rate).toEqual({ num: 30000, den: 1001 });
    expect(t.frameCount).toBe(360);
    expect(t.durationSec).toBeCloseTo((360 * 1001) / 30000, 12);
    expect(t.lost).toEqual({ frames: 45, isLowerBound: true });
  });
});
