import { describe, expect, it } from "vitest";
import { severityEnum } from "@/db/schema/enums";
import { SEVERITIES, SEVERITIES_WORST_FIRST, SEVERITY_SCALE, isSeverity } from "@/lib/findings/severity-scale";

describe("severity scale", () => {
  it("is exactly the database enum finding_severity, in the same order", () => {
    expect([...SEVERITIES]).toEqual(severityEnum.enumValues);
  });

  // FHWA National Bridge Inventory condition ratings (Recording and Coding Guide, items 58-62), as
  // listed in docs/outside-checks.md: 9 Excellent ... 5 Fair ... 3 Serious, 2 Critical, 1 Imminent failure, 0 Failed;
  // overall Good 7-9, Fair 5-6, Poor 0-4.
  const NBI_WORDS_PUBLISHED: Record<number, string> = { 5: "Fair", 3: "Serious", 2: "Critical" };
  const overall = (n: number) => (n >= 7 ? "Good" : n >= 5 ? "Fair" : "Poor");

  it("maps every level to an NBI rating on the 0-9 scale, worse level lower rating", () => {
    const ratings = SEVERITIES.map((s) => SEVERITY_SCALE[s].nbiRating);
    for (const r of ratings) expect(Number.isInteger(r) && r >= 0 && r <= 9).toBe(true);
    for (let i = 1; i < ratings.length; i++) expect(ratings[i]).toBeLessThan(ratings[i - 1]);
  });

  it("uses the NBI's own words where they were read in the guide", () => {
    for (const s of SEVERITIES) {
      const { nbiRating, nbiWord } = SEVERITY_SCALE[s];
      if (NBI_WORDS_PUBLISHED[nbiRating]) expect(nbiWord).toBe(NBI_WORDS_PUBLISHED[nbiRating]);
    }
  });

  it("keeps the overall bands: note/minor Good, moderate Fair, major and worse Poor", () => {
    expect(overall(SEVERITY_SCALE.note.nbiRating)).toBe("Good");
    expect(overall(SEVERITY_SCALE.minor.nbiRating)).toBe("Good");
    expect(overall(SEVERITY_SCALE.moderate.nbiRating)).toBe("Fair");
    for (const s of ["major", "severe", "critical"] as const) expect(overall(SEVERITY_SCALE[s].nbiRating)).toBe("Poor");
  });

  it("has a label and a written meaning for every level, and an outline that thickens with severity", () => {
    const outlines = SEVERITIES.map((s) => SEVERITY_SCALE[s].outlinePx);
    for (let i = 1; i < outlines.length; i++) expect(outlines[i]).toBeGreaterThan(outlines[i - 1]);
    for (const s of SEVERITIES) {
      expect(SEVERITY_SCALE[s].value).toBe(s);
      expect(SEVERITY_SCALE[s].label.length).toBeGreaterThan(2);
      expect(SEVERITY_SCALE[s].meaning.length).toBeGreaterThan(30);
    }
    expect(new Set(SEVERITIES.map((s) => SEVERITY_SCALE[s].label)).size).toBe(SEVERITIES.length);
    expect(SEVERITIES_WORST_FIRST[0]).toBe("critical");
  });

  it("recognises only its own words", () => {
    expect(isSeverity("major")).toBe(true);
    for (const v of ["Major", "catastrophic", "", null, 3]) expect(isSeverity(v)).toBe(false);
  });
});
