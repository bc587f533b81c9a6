// The flight header's words, from the flight timeline built by lib/flight-timeline (its own tests check
// the figures): an outage between files is a loss, and "First degradation" is never "none" beside one.
import { describe, expect, it } from "vitest";
import { buildFlightTimeline, type TimelineFileInput } from "@/lib/flight-timeline/build-flight-timeline";
import { firstDegradationLabel, gapWords } from "@/components/flight-timeline/flight-timeline";
import { describeFirstDegradation } from "@/components/trace/trace-summary";

const file = (id: string, closedAt: string, seconds: number, trace: Partial<NonNullable<TimelineFileInput["trace"]>> | null): TimelineFileInput => ({
  id,
  originalName: `${id}.264`,
  sequenceIndex: 0,
  recorderModifiedAt: new Date(closedAt),
  state: "ready",
  durationSec: seconds,
  trace: trace && { durationSec: seconds, frameCount: seconds * 30, intactFrames: seconds * 30, intactShare: 1, firstDegradationSec: null, longestLossSec: 0, lostFrames: 0, lostIsLowerBound: false, ...trace },
});

describe("the flight header", () => {
  it("two intact files split by a 12 s outage: first degradation at the end of the first file, not 'none'", () => {
    // file 1 closes at 10:00:10 after 10 s; file 2 (10 s) closes at 10:00:32, so it started at 10:00:22
    const t = buildFlightTimeline([file("a", "2026-03-14T10:00:10Z", 10, {}), file("b", "2026-03-14T10:00:32Z", 10, {})]);
    expect(t.summary.longestLossSec).toBeGreaterThan(0);
    const label = firstDegradationLabel(t);
    expect(label).toBe("00:00:10.000 (flight time): video lost between files 1 and 2");
    expect(describeFirstDegradation(t.summary.firstDegradation?.flightSec ?? null, true, "flight", label)).not.toBe("none");
    expect(gapWords(t.gaps[0])).toBe("Video lost between files for about 12.0 s (estimated from the recorder's file times)");
  });

  it("labels a flight moment as the player labels frames (rounded up to the millisecond)", () => {
    const t = buildFlightTimeline([file("a", "2026-03-14T10:00:10Z", 10, { firstDegradationSec: 40 / 30, intactFrames: 290, intactShare: 290 / 300 })]);
    expect(firstDegradationLabel(t)).toBe("00:00:01.334 (flight time)");
  });

  it("a short gap is a gap, not a loss", () => {
    const t = buildFlightTimeline([file("a", "2026-03-14T10:00:10Z", 10, {}), file("b", "2026-03-14T10:00:21Z", 10, {})]);
    expect(gapWords(t.gaps[0])).toBe("Gap of 1.0 s between files");
    expect(firstDegradationLabel(t)).toBeUndefined();
  });
});
