// The report's cautions follow every figure it prints (issue: a 130 m finding on a 61 m flight
// printed no altitude caution, and ground and slant distances printed no radio-range caution).
// Threshold: 120 m, the lower of 14 CFR 107.51 (400 ft = 121.92 m) and Regulation (EU) 2019/947
// Art. 4(1)(e) (120 m), as lib/geo/cautions.ts says.
import { describe, expect, it } from "vitest";
import { reportCautions } from "@/lib/reports/report-cautions";

const ids = (heightsM: (number | null)[], showsDistances: boolean) => reportCautions({ heightsM, showsDistances }).map((c) => c.id);

describe("reportCautions", () => {
  it("takes the altitude caution from a finding's height as well as the flights' maxima", () => {
    expect(ids([61, 130], false)).toContain("altitude-limit");
    expect(ids([61, null, 120], false)).not.toContain("altitude-limit"); // at the limit: "at most"
  });
  it("adds the radio-range caution when distances to the aircraft are printed", () => {
    expect(ids([61], true)).toEqual(["radio-range", "visual-line-of-sight", "local-rules"]);
    expect(ids([], false)).toEqual(["visual-line-of-sight", "local-rules"]);
  });
  it("always ends with the local rules and the pilot in command", () => {
    const all = reportCautions({ heightsM: [200], showsDistances: true });
    expect(all.at(-1)!.summary).toContain("pilot in command decide");
  });
});
