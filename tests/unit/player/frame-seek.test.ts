import { describe, expect, it } from "vitest";
import { frameOnScreen, seekTimeForFrame } from "@/components/player/frame-seek";
import { FRAME_RATES } from "@/lib/timecode/frame-rate";
import { timeOfFrame } from "@/lib/timecode/time-of-frame";

describe("frame-exact seeking", () => {
  it.each([FRAME_RATES.fps29_97, FRAME_RATES.fps25, FRAME_RATES.fps30, FRAME_RATES.fps59_94])("seeks inside the frame and reads it back, at %o", (rate) => {
    const count = 20_000;
    for (let f = 0; f < count; f += 7) {
      const t = seekTimeForFrame(f, rate, count);
      // strictly inside [start of f, start of f+1): a player shows frame f there
      expect(t).toBeGreaterThan(timeOfFrame(f, rate));
      expect(t).toBeLessThan(timeOfFrame(f + 1, rate));
      expect(frameOnScreen(t, rate, count)).toBe(f);
    }
  });

  it("keeps frames inside the recording", () => {
    expect(frameOnScreen(1e9, FRAME_RATES.fps30, 60)).toBe(59);
    expect(frameOnScreen(-1, FRAME_RATES.fps30, 60)).toBe(0);
    expect(seekTimeForFrame(100, FRAME_RATES.fps30, 60)).toBe(seekTimeForFrame(59, FRAME_RATES.fps30, 60));
    expect(seekTimeForFrame(-3, FRAME_RATES.fps30, 60)).toBe(0.5 / 30);
  });
});
