// The link-state band's geometry and words. Times are formatted by lib/timecode (tested there
// against its own references); here: positions in percent worked by hand, labels with their words.
import { describe, expect, it } from "vitest";
import { describeInterval, layoutTraceBand, type BandInterval } from "@/components/trace/layout-trace-band";

const intervals: BandInterval[] = [
  { state: "intact", startFrame: 0, endFrame: 40, startSec: 0, endSec: 40 / 30, playableStartSec: 0, playableEndSec: 40 / 30 },
  { state: "lost", startFrame: 40, endFrame: 43, startSec: 40 / 30, endSec: 43 / 30, playableStartSec: 40 / 30, playableEndSec: 40 / 30 },
  { state: "damaged", startFrame: 43, endFrame: 60, startSec: 43 / 30, endSec: 2, playableStartSec: 40 / 30, playableEndSec: 57 / 30 },
  { state: "intact", startFrame: 60, endFrame: 90, startSec: 2, endSec: 3, playableStartSec: 57 / 30, playableEndSec: 87 / 30 },
];

describe("layoutTraceBand", () => {
  it("on the recorder's clock, intervals tile the band by their frame slots", () => {
    const s = layoutTraceBand(intervals, "recorder", 3);
    expect(s.map((x) => [x.state, +x.leftPct.toFixed(4), +x.widthPct.toFixed(4)])).toEqual([
      ["intact", 0, 44.4444],
      ["lost", 44.4444, 3.3333],
      ["damaged", 47.7778, 18.8889],
      ["intact", 66.6667, 33.3333],
    ]);
  });

  it("on the playable's clock, a lost interval sits at its point (drawn with a minimum width in pixels)", () => {
    const s = layoutTraceBand(intervals, "playable", 87 / 30);
    const lost = s[1];
    expect(lost.leftPct).toBeCloseTo((40 / 87) * 100, 9);
    expect(lost.widthPct).toBe(0);
    expect(s[3].leftPct + s[3].widthPct).toBeCloseTo(100, 9);
  });

  it("labels each interval with its state word, its span and its length", () => {
    expect(describeInterval(intervals[1])).toBe("Video lost: 00:00:01.333 to 00:00:01.433 (3 frames, 0.100 s)");
    expect(describeInterval({ state: "intact", startFrame: 0, endFrame: 1, startSec: 0, endSec: 1 / 30 })).toMatch(/^Picture clear: .* \(1 frame, 0\.033 s\)$/);
  });

  it("draws nothing for an empty recording", () => {
    expect(layoutTraceBand(intervals, "recorder", 0)).toEqual([]);
  });
});
