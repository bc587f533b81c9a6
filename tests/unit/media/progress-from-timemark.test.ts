// ffmpeg's progress time (`time=HH:MM:SS.ss` on stderr, fluent-ffmpeg's "timemark") turned into a
// clamped percentage. Time format: ffmpeg-utils(1), "Time duration" ([-][HH:]MM:SS[.m...]); the
// values below are worked by hand from that syntax.
import { describe, expect, it } from "vitest";
import { clampPercent, parseTimemark, progressFromTimemark } from "@/lib/processing/progress-from-timemark";

describe("parseTimemark", () => {
  it.each([
    ["00:00:00.00", 0],
    ["00:01:02.50", 62.5],
    ["01:00:00.00", 3600],
    ["10:59:59.99", 39599.99],
    ["-00:00:00.04", -0.04],
  ])("%s -> %f s", (mark, seconds) => {
    expect(parseTimemark(mark)).toBeCloseTo(seconds, 9);
  });

  it.each([[undefined], [null], [""], ["N/A"], ["1:2"], ["00:61:00.00"], ["abc"]])("unreadable %s -> null", (mark) => {
    expect(parseTimemark(mark as string)).toBeNull();
  });
});

describe("progressFromTimemark", () => {
  it("is the share of the expected duration, in percent with one decimal", () => {
    expect(progressFromTimemark("00:00:30.00", 120)).toBe(25);
    expect(progressFromTimemark("00:00:01.00", 3)).toBe(33.3);
  });

  it("clamps past the end (ffmpeg reports the last frame's end) and before the start", () => {
    expect(progressFromTimemark("00:02:00.04", 120)).toBe(100);
    expect(progressFromTimemark("-00:00:00.04", 120)).toBe(0);
  });

  it("gives null without a usable duration or time", () => {
    expect(progressFromTimemark("00:00:30.00", 0)).toBeNull();
    expect(progressFromTimemark("00:00:30.00", Number.NaN)).toBeNull();
    expect(progressFromTimemark("N/A", 10)).toBeNull();
  });

  it("clampPercent keeps 0..100 and maps non-numbers to 0", () => {
    expect([clampPercent(-5), clampPercent(42.5), clampPercent(180), clampPercent(Number.NaN), clampPercent(Infinity)]).toEqual([0, 42.5, 100, 0, 0]);
  });
});
