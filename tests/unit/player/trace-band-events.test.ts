// The band's link events and words: numbered in time order, the crew's words, "at least" where the
// lost count is a lower bound. Positions worked by hand from the frame slots.
import { describe, expect, it } from "vitest";
import { bandEvents, describeInterval, layoutTraceBand, type BandInterval } from "@/components/trace/layout-trace-band";
import { describeFirstDegradation } from "@/components/trace/trace-summary";

const fps = 30;
const iv = (state: BandInterval["state"], startFrame: number, endFrame: number): BandInterval => ({ state, startFrame, endFrame, startSec: startFrame / fps, endSec: endFrame / fps });
// 12 s at 30 fps: a 13-frame loss at slot 150, damage to the next IDR at 180, break-up at 240-255
const intervals = [iv("intact", 0, 150), iv("lost", 150, 163), iv("damaged", 163, 180), iv("intact", 180, 240), iv("damaged", 240, 255), iv("intact", 255, 360)];

describe("link events on the band", () => {
  it("are numbered in time order with the crew's words", () => {
    const events = bandEvents(intervals, "recorder");
    expect(events.map((e) => [e.n, e.word, e.atFrame])).toEqual([
      [1, "Video lost", 150],
      [2, "Picture breaking up", 163],
      [3, "Video back", 180],
      [4, "Picture breaking up", 240],
      [5, "Video back", 255],
    ]);
    expect(events[0].lengthWords).toBe("13 frames, 0.433 s");
    expect(events[0].atSec).toBeCloseTo(5, 12);
    // no insurance words anywhere
    for (const e of events) expect(e.word).not.toMatch(/total loss|degradation|reacquired/i);
  });

  it("say 'at least' for lost frames when the count is a lower bound", () => {
    expect(bandEvents(intervals, "recorder", true)[0].lengthWords).toBe("at least 13 frames, 0.433 s");
    expect(describeInterval(intervals[1], true)).toBe("Video lost: 00:00:05.000 to 00:00:05.433 (at least 13 frames, 0.433 s)");
    // damaged counts are exact: no "at least" there
    expect(bandEvents(intervals, "recorder", true)[1].lengthWords).toBe("17 frames, 0.567 s");
    expect(describeInterval({ ...intervals[1], lostIsLowerBound: true })).toContain("at least 13 frames");
  });

  it("a 13-frame loss in 12 s is a real share of the band on the recorder's clock", () => {
    const seg = layoutTraceBand(intervals, "recorder", 12)[1];
    expect(seg.leftPct).toBeCloseTo((150 / 360) * 100, 9);
    expect(seg.widthPct).toBeCloseTo((13 / 360) * 100, 9);
  });

  it("the summary never says 'none' for the first degradation beside a loss", () => {
    expect(describeFirstDegradation(null, true, "flight")).not.toBe("none");
    expect(describeFirstDegradation(null, false, "flight")).toBe("none");
    expect(describeFirstDegradation(5, true, "recording")).toBe("at 00:00:05.000");
  });
});
