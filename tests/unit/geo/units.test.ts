import { describe, expect, it } from "vitest";
import {
  convertLength,
  feetToMetres,
  formatLength,
  metresToFeet,
  metresToNauticalMiles,
  metresToStatuteMiles,
  nauticalMilesToMetres,
  statuteMilesToMetres,
} from "@/lib/geo/units";
import { GeoInputError } from "@/lib/geo/geo-input-error";

/** The decimal n × 0.3048 written out exactly (n a whole number), so Number() rounds it once, correctly. */
function exactFeetInMetresDecimal(n: number): string {
  const tenThousandths = BigInt(n) * 3048n;
  const whole = tenThousandths / 10000n;
  const frac = (tenThousandths % 10000n).toString().padStart(4, "0");
  return `${whole}.${frac}`;
}

describe("defining values", () => {
  it("1 ft = 0.3048 m exactly", () => {
    // NIST SP 811 Appendix B (international foot, 1959 agreement): 1 ft = 0.3048 m exactly.
    expect(feetToMetres(1)).toBe(0.3048);
    expect(metresToFeet(0.3048)).toBe(1);
  });

  it("1 mi = 1609.344 m and 1 nmi = 1852 m exactly", () => {
    // NIST SP 811 Appendix B: mile (international) = 1.609344 E+03 m; nautical mile = 1.852 E+03 m.
    expect(statuteMilesToMetres(1)).toBe(1609.344);
    expect(metresToStatuteMiles(1609.344)).toBe(1);
    expect(nauticalMilesToMetres(1)).toBe(1852);
    expect(metresToNauticalMiles(1852)).toBe(1);
  });

  it("1 mi = 5280 ft, and a nautical mile is 1852 / 0.3048 ft", () => {
    // NIST SP 811 Appendix B: the international mile is 5280 international feet.
    expect(metresToFeet(statuteMilesToMetres(1))).toBe(5280);
    expect(convertLength({ value: 1, unit: "nmi" }, "ft").value).toBeCloseTo(6076.1154855643, 9);
  });

  it("400 ft AGL is 121.92 m", () => {
    // 400 × 0.3048 = 121.92 exactly (NIST SP 811 definition of the foot); the common 400 ft limit.
    expect(feetToMetres(400)).toBe(121.92);
    expect(convertLength({ value: 400, unit: "ft" }, "m")).toEqual({ value: 121.92, unit: "m" });
  });

  it("whole feet convert to the nearest double of the exact decimal, 0 to 20,000 ft", () => {
    // Exact value n × 0.3048 (NIST SP 811) written as a decimal string; Number() rounds it correctly
    // (ECMA-262 StringToNumber). Our result must be that same double, not one ulp away.
    for (let n = 0; n <= 20_000; n++) {
      expect(feetToMetres(n)).toBe(Number(exactFeetInMetresDecimal(n)));
    }
  });

  it("metres to feet and back stays within a few ulps", () => {
    for (const m of [0.1, 1, 9.9, 120, 121.92, 1500.25, 99_999.999]) {
      expect(feetToMetres(metresToFeet(m))).toBeCloseTo(m, 10);
    }
  });
});

describe("formatLength", () => {
  it("always writes the unit, with grouping and the requested decimals", () => {
    // Grouping and rounding follow ECMA-402 Intl.NumberFormat for en-US.
    expect(formatLength({ value: 1967.099, unit: "ft" }, 1)).toBe("1,967.1 ft");
    expect(formatLength({ value: 2354.2284, unit: "ft" }, 2)).toBe("2,354.23 ft");
    expect(formatLength({ value: 2505.14, unit: "ft" }, 0)).toBe("2,505 ft");
    expect(formatLength({ value: 121.92, unit: "m" })).toBe("121.9 m");
    expect(formatLength({ value: 1852, unit: "nmi" }, 0)).toBe("1,852 nmi");
  });

  it("does not print a negative zero", () => {
    expect(formatLength({ value: -0.04, unit: "m" }, 1)).toBe("0.0 m");
    expect(formatLength({ value: -0.06, unit: "m" }, 1)).toBe("-0.1 m");
  });

  it("refuses a precision it cannot honour and a value that is not a number", () => {
    expect(() => formatLength({ value: 1, unit: "m" }, 1.5)).toThrow(GeoInputError);
    expect(() => formatLength({ value: 1, unit: "m" }, -1)).toThrow(GeoInputError);
    expect(() => formatLength({ value: Number.NaN, unit: "m" }, 1)).toThrow(GeoInputError);
  });
});
