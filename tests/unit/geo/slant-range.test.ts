import { describe, expect, it } from "vitest";
import { slantRange } from "@/lib/geo/slant-range";
import { feetToMetres, formatLength, metresToFeet } from "@/lib/geo/units";

describe("slantRange", () => {
  it("6000 ft AGL over 8000 ft of ground is 10,000 ft", () => {
    // Pythagoras' theorem on the 3-4-5 right triangle scaled by 2000: 6000^2 + 8000^2 = 10,000^2, a value
    // any reader can check by hand (docs/outside-checks.md, "Slant range").
    expect(slantRange({ groundDistance: 8000, heightAgl: 6000 })).toBe(10_000);
  });

  it("gives the hypotenuse of another integer right triangle", () => {
    // Pythagoras, the 5-12-13 triangle scaled by 24: 120 m AGL, 288 m ground -> 312 m.
    expect(slantRange({ groundDistance: 288, heightAgl: 120 })).toBe(312);
  });

  // Field figures for 400 ft AGL, checked at the precision they were stated.
  // common practice, no published source
  it.each([
    { ground: 1926, stated: "1967.1", decimals: 1 },
    { ground: 2320, stated: "2354.23", decimals: 2 },
    { ground: 2473, stated: "2505", decimals: 0 },
  ])("400 ft AGL, $ground ft ground -> $stated ft", ({ ground, stated, decimals }) => {
    const slant = slantRange({ groundDistance: ground, heightAgl: 400 });
    expect(slant.toFixed(decimals)).toBe(stated);
  });

  it("prints the first field figure with its unit", () => {
    // common practice, no published source (the 1967.1 ft figure above)
    expect(formatLength({ value: slantRange({ groundDistance: 1926, heightAgl: 400 }), unit: "ft" }, 1)).toBe("1,967.1 ft");
  });

  it("is the same distance whichever unit both inputs share", () => {
    // The foot is 0.3048 m exactly (NIST SP 811), and scaling both legs scales the hypotenuse.
    const feet = slantRange({ groundDistance: 2473, heightAgl: 400 });
    const metres = slantRange({ groundDistance: feetToMetres(2473), heightAgl: feetToMetres(400) });
    expect(metresToFeet(metres)).toBeCloseTo(feet, 9);
  });

  it("reduces to the other leg when one leg is zero", () => {
    expect(slantRange({ groundDistance: 0, heightAgl: 0 })).toBe(0);
    expect(slantRange({ groundDistance: 0, heightAgl: 120 })).toBe(120);
    expect(slantRange({ groundDistance: 350.5, heightAgl: 0 })).toBe(350.5);
  });
});
