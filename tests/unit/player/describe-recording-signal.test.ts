// The report's line on a recording's signal: "at least N lost" when the stored count is a lower bound,
// and the first degradation at the frame time the review room shows.
import { describe, expect, it } from "vitest";
import { computeRecordingFigures } from "@/lib/recordings/recording-figures";
import { describeRecordingDuration, describeRecordingSignal } from "@/lib/reports/describe-recording-signal";

const states = () => {
  const s = new Uint8Array(360);
  s.fill(2, 150, 163); // 13 lost
  s.fill(1, 163, 180); // 17 breaking up
  return s;
};

describe("the report's signal line", () => {
  it("says 'at least' when the lost count is a lower bound, and a bare number when it is exact", () => {
    const exact = computeRecordingFigures({ frameRate: { num: 30, den: 1 }, states: states(), rendition: "reencode" });
    const bound = computeRecordingFigures({ frameRate: { num: 30, den: 1 }, states: states(), rendition: "reencode", framesLostIsLowerBound: true });
    expect(describeRecordingSignal(exact)).toBe("Signal: 360 frame slots, 13 lost, 17 breaking up, 91.7 % intact; first degradation at 00:00:05.000 (frame 150); longest loss 0.433 s");
    expect(describeRecordingSignal(bound)).toContain("at least 13 lost");
    expect(describeRecordingSignal(exact)).not.toContain("at least");
  });

  it("uses the frame clock of the exact rate (frame 1 at 30000/1001 starts at 33.367 ms, labelled .034)", () => {
    const s = new Uint8Array(60);
    s[1] = 2;
    const f = computeRecordingFigures({ frameRate: { num: 30000, den: 1001 }, states: s, rendition: "reencode" });
    expect(describeRecordingSignal(f)).toContain("first degradation at 00:00:00.034 (frame 1)");
    expect(describeRecordingDuration(f, 10.5)).toBe("00:00:02.002");
  });

  it("has no line without a trace", () => {
    expect(describeRecordingSignal(null)).toBeNull();
    expect(describeRecordingSignal(computeRecordingFigures({ frameRate: { num: 25, den: 1 }, states: null, frameCount: 50, rendition: "transcode" }))).toBeNull();
  });
});
