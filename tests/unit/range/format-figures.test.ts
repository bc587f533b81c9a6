import { describe, expect, it } from "vitest";
import { convertTypedLength, formatBearing, formatMetresIn } from "@/lib/range-checks/format-figures";
import { feetToMetres, slantRange } from "@/lib/geo";

describe("figures on screen", () => {
  it("shows the field figure as 1,967.1 ft", () => {
    // common practice, no published source: 400 ft AGL over 1926 ft of ground -> 1967.1 ft
    expect(formatMetresIn(slantRange({ groundDistance: feetToMetres(1926), heightAgl: feetToMetres(400) }), "ft")).toBe("1,967.1 ft");
  });

  it("writes metres with the unit too", () => {
    expect(formatMetresIn(121.92, "m", 2)).toBe("121.92 m");
  });

  it("writes bearings as degrees true", () => {
    expect(formatBearing(214.04)).toBe("214.0° true");
  });
});

describe("convertTypedLength", () => {
  it("carries 400 ft to 121.92 m and back exactly (1 ft = 0.3048 m, NIST SP 811)", () => {
    expect(convertTypedLength("400", "ft", "m")).toBe("121.92");
    expect(convertTypedLength("121.92", "m", "ft")).toBe("400");
  });

  it("leaves empty or unreadable text as typed", () => {
    expect(convertTypedLength("", "ft", "m")).toBe("");
    expect(convertTypedLength("abc", "ft", "m")).toBe("abc");
    expect(convertTypedLength("12", "m", "m")).toBe("12");
  });
});
