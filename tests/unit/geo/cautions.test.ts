import { describe, expect, it } from "vitest";
import {
  ALTITUDE_CAUTION_THRESHOLD_M,
  CAUTIONS,
  altitudeCautions,
  rangeCheckCautions,
  type Caution,
} from "@/lib/geo/cautions";
import { feetToMetres } from "@/lib/geo/units";

const ids = (cs: readonly Caution[]) => cs.map((c) => c.id);

describe("caution texts", () => {
  it("each has an id, a one-line summary, a few sentences of detail and named sources", () => {
    expect(new Set(ids(CAUTIONS)).size).toBe(CAUTIONS.length);
    for (const c of CAUTIONS) {
      expect(c.summary).not.toMatch(/\n/);
      expect(c.summary.length).toBeLessThanOrEqual(100);
      const sentences = c.detail.split(/(?<=\.)\s+/).length;
      expect(sentences, c.id).toBeGreaterThanOrEqual(2);
      expect(sentences, c.id).toBeLessThanOrEqual(6);
      expect(c.sources.length, c.id).toBeGreaterThan(0);
    }
  });

  it("cite the rules they paraphrase", () => {
    // docs/outside-checks.md, "Aviation rules behind the cautions": 14 CFR 107.51 (400 ft AGL, 3 statute miles
    // visibility), 14 CFR 107.31 (visual line of sight), EU 2019/947 Art. 4(1)(e) (120 m).
    const byId = Object.fromEntries(CAUTIONS.map((c) => [c.id, c]));
    expect(byId["altitude-limit"].sources.join(" ")).toMatch(/107\.51/);
    expect(byId["altitude-limit"].sources.join(" ")).toMatch(/2019\/947.*4\(1\)\(e\)/);
    expect(byId["altitude-limit"].detail).toMatch(/400 ft/);
    expect(byId["altitude-limit"].detail).toMatch(/120 m/);
    expect(byId["visual-line-of-sight"].sources.join(" ")).toMatch(/107\.31/);
    expect(byId["visual-line-of-sight"].detail).toMatch(/3 statute miles/);
    expect(byId["radio-range"].summary).toMatch(/radio link, not permission/);
  });

  it("defer to local rules and the pilot in command and never give a verdict", () => {
    // docs/product-rules.md, "Safety cautions": never a verdict; the app defers to local rules and the
    // pilot in command.
    const verdict = /\b(illegal|unlawful|violat\w*|prohibited|forbidden|compliant|non-compliant|safe to fly|you may fly|you must not|approved)\b/i;
    for (const c of CAUTIONS) {
      expect(c.detail, c.id).toMatch(/pilot in command decides/);
      expect(`${c.summary} ${c.detail}`, c.id).not.toMatch(verdict);
    }
  });
});

describe("altitudeCautions", () => {
  it("adds the altitude caution above 120 m, the lower of 120 m and 400 ft", () => {
    // EU 2019/947 Art. 4(1)(e): 120 m; 14 CFR 107.51: 400 ft = 121.92 m (NIST SP 811 foot).
    expect(ALTITUDE_CAUTION_THRESHOLD_M).toBe(120);
    expect(ids(altitudeCautions(119.9))).toEqual(["local-rules"]);
    expect(ids(altitudeCautions(120))).toEqual(["local-rules"]);
    expect(ids(altitudeCautions(120.01))).toEqual(["altitude-limit", "local-rules"]);
    expect(ids(altitudeCautions(feetToMetres(400)))).toEqual(["altitude-limit", "local-rules"]);
    expect(ids(altitudeCautions(feetToMetres(393)))).toEqual(["local-rules"]);
    expect(ids(altitudeCautions(0))).toEqual(["local-rules"]);
  });
});

describe("rangeCheckCautions", () => {
  it("always carries the radio-link, line-of-sight and local-rules cautions, and the altitude one when above 120 m", () => {
    expect(ids(rangeCheckCautions(60))).toEqual(["radio-range", "visual-line-of-sight", "local-rules"]);
    expect(ids(rangeCheckCautions(150))).toEqual(["radio-range", "visual-line-of-sight", "altitude-limit", "local-rules"]);
  });
});
