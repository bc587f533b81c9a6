import { describe, expect, it } from "vitest";
import { linkEventForInterval, traceLinkEvents } from "@/lib/range-checks/trace-interval-event";
import type { TraceInterval } from "@/db/schema/media";

const fps = 30;
// builds a trace from [state, frames] pairs, frame counts chosen so times are exact at 30 fps
function trace(...parts: [TraceInterval["state"], number][]): TraceInterval[] {
  let frame = 0;
  return parts.map(([state, frames]) => {
    const iv = { state, startFrame: frame, endFrame: frame + frames - 1, startSec: frame / fps, endSec: (frame + frames) / fps };
    frame += frames;
    return iv;
  });
}

describe("linkEventForInterval", () => {
  const t = trace(["intact", 300], ["damaged", 60], ["lost", 90], ["intact", 150], ["intact", 30], ["damaged", 15], ["intact", 45]);

  it("maps a damaged start to first degradation, a lost start to total loss", () => {
    expect(linkEventForInterval(t, 1)).toBe("first_degradation");
    expect(linkEventForInterval(t, 2)).toBe("total_loss");
    expect(linkEventForInterval(t, 5)).toBe("first_degradation");
  });

  it("maps intact after lost or damaged to reacquired", () => {
    expect(linkEventForInterval(t, 3)).toBe("reacquired");
    expect(linkEventForInterval(t, 6)).toBe("reacquired");
  });

  it("gives no event for intact video at the start or after intact video", () => {
    expect(linkEventForInterval(t, 0)).toBeNull();
    expect(linkEventForInterval(t, 4)).toBeNull();
  });

  it("gives no event for an index outside the trace", () => {
    for (const i of [-1, 7, 1.5, Number.NaN]) expect(linkEventForInterval(t, i)).toBeNull();
  });

  it("handles a recording that starts lost (the recorder opened a new file mid-loss)", () => {
    const s = trace(["lost", 30], ["intact", 30]);
    expect(linkEventForInterval(s, 0)).toBe("total_loss");
    expect(linkEventForInterval(s, 1)).toBe("reacquired");
  });
});

describe("traceLinkEvents", () => {
  it("lists every marked start with its time, frame and duration", () => {
    const events = traceLinkEvents(trace(["intact", 300], ["damaged", 60], ["lost", 90], ["intact", 150]));
    expect(events).toEqual([
      { intervalIndex: 1, event: "first_degradation", atSec: 10, atFrame: 300, state: "damaged", durationSec: 2 },
      { intervalIndex: 2, event: "total_loss", atSec: 12, atFrame: 360, state: "lost", durationSec: 3 },
      { intervalIndex: 3, event: "reacquired", atSec: 15, atFrame: 450, state: "intact", durationSec: 5 },
    ]);
  });

  it("is empty for a trace of intact video only", () => {
    expect(traceLinkEvents(trace(["intact", 900]))).toEqual([]);
  });
});
