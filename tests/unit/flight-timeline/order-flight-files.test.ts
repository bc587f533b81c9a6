// The order of a flight's files. Recorders number their files with zero-padded or plain counters and
// stamp each with the time it was closed (common practice, no published source); numeric comparison
// of digit runs is the Unicode Collation Algorithm's "numeric" option as ICU implements it in
// Intl.Collator (ECMA-402), checked here on names where plain string order would be wrong.
import { describe, expect, it } from "vitest";
import { compareRecorderNames, flightOrder, recorderOrder, type FlightFile } from "@/lib/flight-timeline/order-flight-files";

const f = (id: string, originalName: string, at: string | null, sequenceIndex = 0): FlightFile => ({
  id,
  originalName,
  recorderModifiedAt: at ? new Date(at) : null,
  sequenceIndex,
});

describe("compareRecorderNames", () => {
  it("orders numbers by value, not by character", () => {
    const names = ["clip10.264", "clip9.264", "CLIP11.264", "clip1.264"];
    expect([...names].sort(compareRecorderNames)).toEqual(["clip1.264", "clip9.264", "clip10.264", "CLIP11.264"]);
    // plain code-unit order would put "clip10" before "clip9" and "CLIP11" first
    expect([...names].sort()).toEqual(["CLIP11.264", "clip1.264", "clip10.264", "clip9.264"]);
  });
});

describe("recorderOrder", () => {
  it("uses the file times when every file has a distinct one", () => {
    const files = [f("a", "REC_0003.264", "2026-03-14T10:05:00Z"), f("b", "REC_0001.264", "2026-03-14T10:09:00Z"), f("c", "REC_0002.264", "2026-03-14T10:01:00Z")];
    expect(recorderOrder(files).map((x) => x.id)).toEqual(["c", "a", "b"]);
  });

  it("falls back to the names when a time is missing or times repeat (recorder clock never set)", () => {
    const missing = [f("a", "REC_0010.264", "2026-03-14T10:05:00Z"), f("b", "REC_0009.264", null)];
    expect(recorderOrder(missing).map((x) => x.id)).toEqual(["b", "a"]);
    const same = [f("a", "DVR2.h264", "2000-01-01T00:00:00Z"), f("b", "DVR1.h264", "2000-01-01T00:00:00Z")];
    expect(recorderOrder(same).map((x) => x.id)).toEqual(["b", "a"]);
  });
});

describe("flightOrder", () => {
  it("follows sequenceIndex (the pilot's order) and breaks ties by the recorder order", () => {
    const files = [f("a", "REC_2.264", null, 1), f("b", "REC_1.264", null, 1), f("c", "REC_3.264", null, 0)];
    expect(flightOrder(files).map((x) => x.id)).toEqual(["c", "b", "a"]);
  });
});
