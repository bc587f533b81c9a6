import { describe, expect, it } from "vitest";
import Timecode from "smpte-timecode";
import { describeMoment, formatMoment } from "@/lib/findings/describe-moment";
import { FRAME_RATES } from "@/lib/timecode/frame-rate";

describe("describeMoment", () => {
  it("names SMPTE ST 12-1 worked values: 29.97 DF frame 1800 is 00:01:00;02, 17982 is 00:10:00;00", () => {
    expect(describeMoment(1800, FRAME_RATES.fps29_97).smpte).toBe("00:01:00;02");
    expect(describeMoment(17982, FRAME_RATES.fps29_97).smpte).toBe("00:10:00;00");
    expect(describeMoment(15000, FRAME_RATES.fps25).smpte).toBe("00:10:00:00");
  });

  it("agrees with the npm smpte-timecode package at 29.97 drop-frame over a span of frames", () => {
    for (let f = 0; f < 40000; f += 97) {
      expect(describeMoment(f, FRAME_RATES.fps29_97).smpte).toBe(new Timecode(f, 29.97, true).toString());
    }
  });

  it("gives the clock label that seeks back into the frame: frame 1 at 29.97 is 00:00:00.034", () => {
    // 1001/30000 s = 33.366... ms: the first whole millisecond inside frame 1 is 34
    expect(describeMoment(1, FRAME_RATES.fps29_97).clock).toBe("00:00:00.034");
    expect(describeMoment(30, FRAME_RATES.fps30).clock).toBe("00:00:01.000");
  });

  it("leaves out the SMPTE label where the rate has none, and formats all three together", () => {
    const m = describeMoment(25, { num: 25, den: 2 });
    expect(m.smpte).toBeNull();
    expect(formatMoment(m)).toBe("00:00:02.000 · frame 25");
    expect(formatMoment(describeMoment(37, FRAME_RATES.fps30))).toBe("00:00:01.234 · frame 37 · 00:00:01:07");
  });
});
