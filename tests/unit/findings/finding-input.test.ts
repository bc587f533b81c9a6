import { describe, expect, it } from "vitest";
import { createFindingInput, updateFindingInput } from "@/lib/findings/finding-input";

const id = "7b0d3f1e-3f4c-4c55-9b8a-0d7c0e7a1f00";
const issues = (v: unknown) => {
  const r = createFindingInput.safeParse(v);
  return r.success ? [] : r.error.issues.map((i) => i.path.join(".") || "_");
};

describe("finding input", () => {
  it("accepts a moment, a range, a box and a position", () => {
    expect(issues({ recordingId: id, startFrame: 3, severity: "minor" })).toEqual([]);
    expect(issues({ recordingId: id, startFrame: 3, endFrame: 9, severity: "critical", box: { x: 0, y: 0, w: 1, h: 1 }, latitude: 54.4, longitude: -2.6, note: "<b>x</b>" })).toEqual([]);
  });

  it.each([
    ["unknown severity", { recordingId: id, startFrame: 1, severity: "catastrophic" }, "severity"],
    ["negative frame", { recordingId: id, startFrame: -1, severity: "minor" }, "startFrame"],
    ["negative time", { recordingId: id, startSec: -0.1, severity: "minor" }, "startSec"],
    ["both frame and time", { recordingId: id, startFrame: 1, startSec: 0.1, severity: "minor" }, "startSec"],
    ["box past the right edge", { recordingId: id, startFrame: 1, severity: "minor", box: { x: 0.9, y: 0, w: 0.2, h: 0.1 } }, "box"],
    ["box of no width", { recordingId: id, startFrame: 1, severity: "minor", box: { x: 0.1, y: 0, w: 0, h: 0.1 } }, "box.w"],
    ["latitude out of range", { recordingId: id, startFrame: 1, severity: "minor", latitude: 91, longitude: 0 }, "latitude"],
    ["half a position", { recordingId: id, startFrame: 1, severity: "minor", longitude: 2 }, "latitude"],
    ["a field that is not ours", { recordingId: id, startFrame: 1, severity: "minor", version: 3 }, "_"],
  ])("refuses %s", (_label, value, path) => {
    expect(issues(value)).toContain(path);
  });

  it("leaves absent keys absent in an edit, so a partial edit cannot clear what it did not name", () => {
    const parsed = updateFindingInput.parse({ note: "only the note" });
    expect(Object.keys(parsed)).toEqual(["note"]);
    expect(Object.keys(updateFindingInput.parse({ box: null }))).toEqual(["box"]);
  });
});
