import { describe, expect, it } from "vitest";
import {
  formatCoordinatePair,
  formatDecimalDegrees,
  parseCoordinatePair,
  parseLatitude,
  parseLongitude,
  toDms,
} from "@/lib/geo/parse-coordinate";

// Expected values are worked by hand from the sexagesimal definition 1° = 60', 1' = 60"
// (NIST SP 811, Table 6, units accepted for use with the SI; table number recalled from memory),
// e.g. 51°30'26.5" = 51 + 30/60 + 26.5/3600 = 51.507361111...°.

describe("parseLatitude / parseLongitude", () => {
  it.each([
    ["51.5", 51.5],
    ["-0.12", -0.12],
    ["+12.25", 12.25],
    [".5", 0.5],
    ["51.5 N", 51.5],
    ["51.5N", 51.5],
    ["s 33.25", -33.25],
    ["51.5°", 51.5],
    ["51.5° S", -51.5],
    ["0 S", 0],
    ["-90", -90],
  ])("decimal degrees %j -> %d", (text, expected) => {
    expect(parseLatitude(text)).toBeCloseTo(expected, 12);
  });

  it.each([
    [`51°30'26.5"N`, 51.507361111111],
    ["51 30 26.5 N", 51.507361111111],
    ["51°30′26.5″N", 51.507361111111], // prime and double prime, as phones type them
    ["51º 30' 26.5'' S", -51.507361111111], // ordinal º and two single quotes for seconds
    [`N 51°30'26.5"`, 51.507361111111],
    ["-12 15 36", -12.26],
  ])("degrees-minutes-seconds %j -> %d", (text, expected) => {
    expect(parseLatitude(text)).toBeCloseTo(expected, 10);
  });

  it.each([
    ["N 51 30.44", 51.507333333333],
    ["51°30.44'N", 51.507333333333],
    ["S 0 45.3", -0.755],
  ])("degrees-decimal-minutes %j -> %d", (text, expected) => {
    expect(parseLatitude(text)).toBeCloseTo(expected, 10);
  });

  it.each([
    ["2 07 39 W", -2.1275],
    ["W 2 7.65", -2.1275],
    ["179°59'59.9\"E", 179.999972222222],
    ["-180", -180],
    ["180 E", 180],
  ])("longitude %j -> %d", (text, expected) => {
    expect(parseLongitude(text)).toBeCloseTo(expected, 10);
  });

  it("keeps the equator and the prime meridian at +0", () => {
    expect(Object.is(parseLatitude("0 S"), 0)).toBe(true);
    expect(Object.is(parseLongitude("-0"), 0)).toBe(true);
  });
});

describe("parseCoordinatePair", () => {
  it.each([
    ["51.5, -2.12", { lat: 51.5, lon: -2.12 }],
    ["  -33.25 ;  141.5 ", { lat: -33.25, lon: 141.5 }],
    [`51°30'26"N 2°07'39"W`, { lat: 51.507222222222, lon: -2.1275 }],
    ["N51 30.44 W2 07.65", { lat: 51.507333333333, lon: -2.1275 }],
    ["12 30 S, 45 15 E", { lat: -12.5, lon: 45.25 }],
  ])("%j", (text, expected) => {
    const p = parseCoordinatePair(text);
    expect(p.lat).toBeCloseTo(expected.lat, 10);
    expect(p.lon).toBeCloseTo(expected.lon, 10);
  });
});

describe("formatters", () => {
  it("writes decimal degrees with 6 decimals and no negative zero", () => {
    expect(formatDecimalDegrees(51.5073611111)).toBe("51.507361");
    expect(formatDecimalDegrees(-2.1275)).toBe("-2.127500");
    expect(formatDecimalDegrees(-0.0000001)).toBe("0.000000");
    expect(formatCoordinatePair({ lat: -12.5, lon: 45.25 })).toBe("-12.500000, 45.250000");
  });

  it("writes degrees, minutes and seconds with a hemisphere letter", () => {
    expect(toDms(51.507361111111, "latitude")).toBe(`51°30'26.5"N`);
    expect(toDms(-2.1275, "longitude")).toBe(`2°07'39.0"W`);
    expect(toDms(-12.26, "latitude", 0)).toBe(`12°15'36"S`);
    expect(toDms(0, "longitude")).toBe(`0°00'00.0"E`);
  });

  it("carries rounded seconds into minutes and degrees", () => {
    // 10.99999° = 10°59'59.964" (0.99999 × 60 = 59.9994', 0.9994 × 60 = 59.964"), which rounds to 11°00'00.0".
    expect(toDms(10.99999, "latitude")).toBe(`11°00'00.0"N`);
    // A value that rounds to zero carries no hemisphere of its own.
    expect(toDms(-0.00000001, "latitude")).toBe(`0°00'00.0"N`);
  });

  it("reads back what it writes, to the rounding of the last digit", () => {
    for (const lat of [-89.999, -45.123456, -0.5, 0, 12.3456789, 66.5622, 89.9999]) {
      const back = parseLatitude(toDms(lat, "latitude", 2));
      expect(Math.abs(back - lat) * 3600).toBeLessThanOrEqual(0.005 + 1e-9);
    }
    for (const lon of [-179.9999, -97.5, 0.001, 135.75, 180]) {
      const back = parseLongitude(toDms(lon, "longitude", 2));
      expect(Math.abs(back - lon) * 3600).toBeLessThanOrEqual(0.005 + 1e-9);
    }
    const pair = parseCoordinatePair(formatCoordinatePair({ lat: 47.123456, lon: -122.654321 }));
    expect(pair).toEqual({ lat: 47.123456, lon: -122.654321 });
  });
});
