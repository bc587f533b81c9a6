// One flight across its files: lengths, gaps estimated from the recorder's file times, and the
// flight's summary. Worked examples by hand: a file closed at 10:01:00 after 60 s of recording started
// at 10:00:00; the next, closed at 10:02:30 after 30 s, started at 10:02:00, so the gap is 60 s.
import { describe, expect, it } from "vitest";
import { buildFlightTimeline, estimateGap, type TimelineFileInput } from "@/lib/flight-timeline/build-flight-timeline";

const file = (id: string, name: string, closedAt: string | null, lengthSec: number | null, trace?: Partial<NonNullable<TimelineFileInput["trace"]>>, sequenceIndex = 0): TimelineFileInput => ({
  id,
  originalName: name,
  recorderModifiedAt: closedAt ? new Date(closedAt) : null,
  sequenceIndex,
  state: lengthSec === null ? "processing" : "ready",
  durationSec: lengthSec,
  trace:
    trace && lengthSec !== null
      ? {
          durationSec: lengthSec,
          frameCount: Math.round(lengthSec * 30),
          intactFrames: Math.round(lengthSec * 30),
          intactShare: 1,
          firstDegradationSec: null,
          longestLossSec: 0,
          ...trace,
        }
      : null,
});

describe("estimateGap", () => {
  it("is the next file's start (close time - length) minus the previous close time", () => {
    const a = file("a", "REC_1.264", "2026-03-14T10:01:00Z", 60);
    const b = file("b", "REC_2.264", "2026-03-14T10:02:30Z", 30);
    expect(estimateGap(a, b)).toEqual({ seconds: 60, reason: null });
  });

  it("is unknown without file times, before processing, or when the times contradict the order", () => {
    expect(estimateGap(file("a", "1", null, 60), file("b", "2", "2026-03-14T10:02:30Z", 30)).seconds).toBeNull();
    expect(estimateGap(file("a", "1", "2026-03-14T10:01:00Z", 60), file("b", "2", "2026-03-14T10:02:30Z", null)).reason).toBe("file not processed yet");
    expect(estimateGap(file("a", "1", "2026-03-14T10:05:00Z", 60), file("b", "2", "2026-03-14T10:02:30Z", 30)).reason).toBe("file times contradict the order");
  });

  it("does not call two ordinary files' times a contradiction when they are copy times (written a moment apart, closer than the file lasts)", () => {
    // two 4 s files copied off the card (or saved by a browser) 40 ms apart: the times are in order but
    // are not the recorder's close times, so the gap cannot be told; nothing contradicts the order
    const a = file("a", "REC_0001.264", "2026-03-14T10:01:00.000Z", 4);
    const b = file("b", "REC_0002.264", "2026-03-14T10:01:00.040Z", 4);
    const g = estimateGap(a, b);
    expect(g.seconds).toBeNull();
    expect(g.reason).not.toMatch(/contradict/);
    expect(g.reason).toBe("file times are when the files were copied, not when they were recorded");
    const timeline = buildFlightTimeline([a, { ...b, sequenceIndex: 1 }]);
    expect(timeline.gaps.map((x) => x.reason)).toEqual(["file times are when the files were copied, not when they were recorded"]);
  });

  it("counts a small overlap (clock and frame-rate slack, up to 2 s) as no gap", () => {
    const a = file("a", "1", "2026-03-14T10:01:00Z", 60);
    const b = file("b", "2", "2026-03-14T10:01:29Z", 30);
    expect(estimateGap(a, b)).toEqual({ seconds: 0, reason: null });
  });
});

describe("buildFlightTimeline", () => {
  it("lays the files out with their gaps and summarises the link over the flight", () => {
    const t = buildFlightTimeline([
      file("b", "REC_2.264", "2026-03-14T10:02:30Z", 30, { frameCount: 900, intactFrames: 600, intactShare: 600 / 900, firstDegradationSec: 12, longestLossSec: 1.5 }, 1),
      file("a", "REC_1.264", "2026-03-14T10:01:00Z", 60, {}, 0),
      file("c", "REC_3.264", "2026-03-14T10:04:00Z", 45, { frameCount: 1350, intactFrames: 1350, longestLossSec: 0 }, 2),
    ]);
    expect(t.segments.map((s) => [s.recordingId, s.flightStartSec, s.lengthSec])).toEqual([
      ["a", 0, 60],
      ["b", 120, 30],
      ["c", 195, 45],
    ]);
    // c closed 10:04:00 after 45 s: started 10:03:15, 45 s after b closed at 10:02:30
    expect(t.gaps.map((g) => g.seconds)).toEqual([60, 45]);
    // The gaps are outages (longer than the tolerance): lost video between the files, estimated.
    expect(t.summary).toMatchObject({
      files: 3,
      recordedSec: 135,
      spanSec: 240,
      longestLossSec: 60,
      longestLossEstimated: true,
      longestGapSec: 60,
      unknownGaps: 0,
      outages: 2,
      outageSec: 105,
      firstDegradation: { recordingId: "a", index: 0, atSec: 60, flightSec: 60, between: true },
    });
    // intact seconds (60 + 30 * 600/900 + 45) of the flight's 240 s, outages included
    expect(t.summary.intactShare).toBeCloseTo(125 / 240, 12);
  });

  it("files that follow each other within the tolerance have no outage; the first trouble is inside a file", () => {
    const t = buildFlightTimeline([
      file("a", "REC_1.264", "2026-03-14T10:01:00Z", 60, {}, 0),
      // closed 10:01:31 after 30 s: started 10:01:01, 1 s after a closed
      file("b", "REC_2.264", "2026-03-14T10:01:31Z", 30, { frameCount: 900, intactFrames: 600, firstDegradationSec: 12, longestLossSec: 1.5, lostFrames: 45, lostIsLowerBound: true }, 1),
    ]);
    expect(t.summary).toMatchObject({
      outages: 0,
      outageSec: 0,
      longestLossSec: 1.5,
      longestLossEstimated: false,
      lostFrames: 45,
      lostIsLowerBound: true,
      firstDegradation: { recordingId: "b", index: 1, atSec: 12, flightSec: 73, between: false },
    });
    // the 1 s gap is within the tolerance: not counted as time
    expect(t.summary.intactShare).toBeCloseTo((60 + 20) / 90, 12);
  });

  it("keeps going past an unknown gap, with flight times unknown from there on", () => {
    const t = buildFlightTimeline([file("a", "A1", null, 10, {}), file("b", "A2", null, 20, {}, 1)]);
    expect(t.gaps[0]).toMatchObject({ seconds: null, reason: "file times unknown" });
    expect(t.segments.map((s) => s.flightStartSec)).toEqual([0, null]);
    expect(t.summary).toMatchObject({ spanSec: null, unknownGaps: 1, recordedSec: 30, longestGapSec: null });
  });

  it("handles a flight with no files", () => {
    expect(buildFlightTimeline([]).summary).toMatchObject({ files: 0, spanSec: 0, intactShare: null, firstDegradation: null });
  });
});
