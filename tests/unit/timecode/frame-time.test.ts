import { describe, expect, it } from "vitest";
import webvtt from "webvtt-parser";
import { FRAME_RATES, type FrameRate } from "@/lib/timecode/frame-rate";
import { timeOfFrame } from "@/lib/timecode/time-of-frame";
import { frameAtTime } from "@/lib/timecode/frame-at-time";
import { formatClockTime, formatClockTimeMs } from "@/lib/timecode/format-clock-time";
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import { parseTimecode } from "@/lib/timecode/parse-timecode";

// Independent reader of "HH:MM:SS.mmm": the W3C webvtt.js timestamp parser (npm webvtt-parser),
// which implements the WebVTT spec's "collect a WebVTT timestamp" algorithm.
function parseWithW3cParser(text: string): number {
  const errors: string[] = [];
  const value = new webvtt.WebVTTCueTimingsAndSettingsParser(text, (message) => errors.push(message)).parseTimestamp();
  if (value === undefined || errors.length > 0) throw new Error(`W3C parser refused ${text}: ${errors.join("; ")}`);
  return value;
}

const rates: Array<[string, FrameRate]> = [
  ["23.976", FRAME_RATES.fps23_976],
  ["25", FRAME_RATES.fps25],
  ["29.97", FRAME_RATES.fps29_97],
  ["59.94", FRAME_RATES.fps59_94],
  ["60", FRAME_RATES.fps60],
];

describe("time of frame N = N * den / num", () => {
  it("is exact where the ratio is", () => {
    expect(timeOfFrame(30000, FRAME_RATES.fps29_97)).toBe(1001);
    expect(timeOfFrame(15000, FRAME_RATES.fps25)).toBe(600);
    expect(timeOfFrame(0, FRAME_RATES.fps59_94)).toBe(0);
  });

  it("places drop-frame timecode against the wall clock", () => {
    // 00:10:00;00 (frame 17982, SMPTE ST 12-1 worked value; docs/outside-checks.md) comes 0.6 ms before ten minutes
    // of real time, and a full day of drop-frame labels (144 x 17982 frames) runs out 86.4 ms before
    // 24 h of real time: the known residual of drop-frame counting (86.4 ms/day recalled from memory).
    expect(timeOfFrame(parseTimecode("00:10:00;00", FRAME_RATES.fps29_97), FRAME_RATES.fps29_97)).toBeCloseTo(599.9994, 9);
    expect(timeOfFrame(144 * 17982, FRAME_RATES.fps29_97)).toBeCloseTo(86_400 - 0.0864, 7);
  });
});

describe.each(rates)("frame at time at %s fps", (_name, rate) => {
  const frameSeconds = rate.den / rate.num;

  it("a time exactly on a frame start lands on that frame (every frame up to 200,000)", () => {
    for (let n = 0; n <= 200_000; n++) {
      const t = timeOfFrame(n, rate);
      if (frameAtTime(t, rate) !== n) expect({ n, got: frameAtTime(t, rate) }).toEqual({ n, got: n });
    }
  });

  it("a time just before the next frame stays on this frame; mid-frame floors", () => {
    for (let n = 0; n <= 200_000; n += 7) {
      const mid = frameAtTime(timeOfFrame(n, rate) + frameSeconds / 2, rate);
      const justBefore = frameAtTime(timeOfFrame(n + 1, rate) - 1e-5, rate);
      if (mid !== n || justBefore !== n) expect({ n, mid, justBefore }).toEqual({ n, mid: n, justBefore: n });
    }
  });

  it("a millisecond label of a frame leads back to the same frame (through the W3C timestamp parser)", () => {
    for (let n = 0; n <= 20_000; n++) {
      const label = formatFrameClockTime(n, rate);
      const back = frameAtTime(parseWithW3cParser(label), rate);
      if (back !== n) expect({ n, label, back }).toEqual({ n, label, back: n });
    }
  });
});

describe("clock time HH:MM:SS.mmm", () => {
  it("formats worked values", () => {
    expect(formatClockTime(0)).toBe("00:00:00.000");
    expect(formatClockTime(3661.5)).toBe("01:01:01.500");
    expect(formatClockTime(59.9996)).toBe("00:01:00.000");
    expect(formatClockTime(0.0004)).toBe("00:00:00.000");
    expect(formatClockTime(360_000)).toBe("100:00:00.000");
    expect(formatFrameClockTime(1, FRAME_RATES.fps29_97)).toBe("00:00:00.034"); // 33.37 ms rounded up
    expect(formatFrameClockTime(30, FRAME_RATES.fps30)).toBe("00:00:01.000"); // exact: no rounding up
  });

  it("reads back through the W3C WebVTT timestamp parser to the same millisecond", () => {
    for (let ms = 0; ms < 7_300_000; ms += 997) {
      expect(Math.round(parseWithW3cParser(formatClockTimeMs(ms)) * 1000)).toBe(ms);
    }
  });

  it("refuses negative and non-finite input", () => {
    expect(() => formatClockTime(-0.5)).toThrow(RangeError);
    expect(() => formatClockTime(Number.NaN)).toThrow(RangeError);
    expect(() => frameAtTime(Number.POSITIVE_INFINITY, FRAME_RATES.fps25)).toThrow(RangeError);
    expect(() => timeOfFrame(1.5, FRAME_RATES.fps25)).toThrow(RangeError);
    expect(() => timeOfFrame(1, { num: 0, den: 1 })).toThrow(RangeError);
  });
});
