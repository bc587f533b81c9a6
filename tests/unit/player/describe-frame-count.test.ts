import { describe, expect, it } from "vitest";
import { describeFrameCount } from "@/components/player/describe-frame-count";
import { describeLostFrames } from "@/lib/recordings/recording-figures";

describe("the frame count beside the frame number", () => {
  it("counts every frame slot: a 360-frame file reads 'of 360', not 'of 359'", () => {
    expect(describeFrameCount(360, null)).toBe("of 360");
    expect(describeFrameCount(360, { frames: 0, isLowerBound: false })).toBe("of 360");
  });

  it("names the lost frames, and says 'at least' when the count is a lower bound", () => {
    expect(describeFrameCount(360, { frames: 45, isLowerBound: false })).toBe("of 360, 45 lost");
    expect(describeFrameCount(360, { frames: 45, isLowerBound: true })).toBe("of 360, at least 45 lost");
    // the same words as the stored figures' own reader
    expect(describeFrameCount(360, { frames: 45, isLowerBound: true })).toContain(describeLostFrames({ framesLost: 45, framesLostIsLowerBound: true }));
  });
});
