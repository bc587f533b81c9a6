import { describe, expect, it } from "vitest";
import { resolveFindingSpan, FindingSpanError, type SpanInput } from "@/lib/findings/resolve-finding-span";
import type { RecordingTiming } from "@/lib/recordings/recording-frame-rate";

// 2 s at 30000/1001: 60 frames, 0..59
const ntsc: RecordingTiming = { rate: { num: 30000, den: 1001 }, fps: 30000 / 1001, frameCount: 60, durationSec: 60 * 1001 / 30000 };

function fields(input: SpanInput): string[] {
  try {
    resolveFindingSpan(input, ntsc);
  } catch (err) {
    if (err instanceof FindingSpanError) return Object.keys(err.fields);
    throw err;
  }
  return [];
}

describe("resolveFindingSpan", () => {
  it("derives seconds from the exact rate: frame n starts at n * 1001 / 30000 s", () => {
    expect(resolveFindingSpan({ startFrame: 31 }, ntsc)).toEqual({ startFrame: 31, endFrame: null, startSec: (31 * 1001) / 30000, endSec: null });
  });

  it("maps a time to the frame on screen at that time, and keeps ranges inclusive", () => {
    // frame 30 starts at 1.001 s: 1.0009 s still shows frame 29, 1.001 s shows frame 30
    expect(resolveFindingSpan({ startSec: 1.0009 }, ntsc).startFrame).toBe(29);
    expect(resolveFindingSpan({ startSec: 1.001 }, ntsc).startFrame).toBe(30);
    const r = resolveFindingSpan({ startFrame: 0, endFrame: 59 }, ntsc);
    expect([r.startFrame, r.endFrame, r.endSec]).toEqual([0, 59, (59 * 1001) / 30000]);
  });

  it.each<[string, SpanInput, string]>([
    ["the frame after the last", { startFrame: 60 }, "startFrame"],
    ["a negative frame", { startFrame: -1 }, "startFrame"],
    ["a fractional frame", { startFrame: 1.5 }, "startFrame"],
    ["the duration itself", { startSec: 60 * 1001 / 30000 }, "startSec"],
    ["a negative time", { startSec: -0.001 }, "startSec"],
    ["NaN", { startSec: Number.NaN }, "startSec"],
    ["a range past the end", { startFrame: 0, endFrame: 60 }, "endFrame"],
    ["a range ending at a time past the end", { startFrame: 0, endSec: 2.5 }, "endSec"],
    ["a range of zero length", { startFrame: 5, endFrame: 5 }, "endFrame"],
    ["a range ending before it starts", { startFrame: 5, endFrame: 4 }, "endFrame"],
    ["nothing", {}, "startFrame"],
  ])("refuses %s", (_label, input, field) => {
    expect(fields(input)).toContain(field);
  });
});
