import { describe, expect, it } from "vitest";
import { GeoInputError } from "@/lib/geo/geo-input-error";
import { parseCoordinatePair, parseLatitude, parseLongitude, toDms } from "@/lib/geo/parse-coordinate";
import { slantRange } from "@/lib/geo/slant-range";
import { direct, inverse } from "@/lib/geo/geodesic";
import { haversineDistanceM } from "@/lib/geo/haversine";
import { altitudeCautions } from "@/lib/geo/cautions";
import { formatLength } from "@/lib/geo/units";

// Limits: latitude within ±90° and longitude within ±180° (the definition of geodetic latitude and
// longitude); 60 minutes to the degree and 60 seconds to the minute (NIST SP 811 sexagesimal units).
const cases: { name: string; run: () => unknown; field: string; message?: RegExp }[] = [
  { name: "latitude 91", run: () => parseLatitude("91"), field: "latitude", message: /beyond 90/ },
  { name: "latitude 90°00'00.1\"", run: () => parseLatitude(`90°00'00.1"`), field: "latitude", message: /beyond 90/ },
  { name: "longitude 181", run: () => parseLongitude("181"), field: "longitude", message: /beyond 180/ },
  { name: "latitude \"abc\"", run: () => parseLatitude("abc"), field: "latitude", message: /not a number/ },
  { name: "latitude \"NaN\"", run: () => parseLatitude("NaN"), field: "latitude", message: /not a number/ },
  { name: "longitude \"Infinity\"", run: () => parseLongitude("Infinity"), field: "longitude", message: /not a number/ },
  { name: "latitude \"\"", run: () => parseLatitude("  "), field: "latitude", message: /empty/ },
  { name: "latitude 51.5.3", run: () => parseLatitude("51.5.3"), field: "latitude", message: /not a number/ },
  { name: "61 minutes", run: () => parseLatitude("51°61'N"), field: "latitude", message: /minutes must be below 60/ },
  { name: "60 seconds", run: () => parseLatitude("51 30 60 N"), field: "latitude", message: /seconds must be below 60/ },
  { name: "sign and hemisphere", run: () => parseLatitude("-51 N"), field: "latitude", message: /sign and a direction letter/ },
  { name: "two hemisphere letters", run: () => parseLatitude("N 51 S"), field: "latitude", message: /two direction letters/ },
  { name: "E on a latitude", run: () => parseLatitude("51 E"), field: "latitude", message: /"E" marks a longitude/ },
  { name: "N on a longitude", run: () => parseLongitude("0.12 N"), field: "longitude", message: /"N" marks a latitude/ },
  { name: "decimal degrees then minutes", run: () => parseLatitude("51.5°30'"), field: "latitude", message: /mixes units/ },
  { name: "minutes mark on the first part", run: () => parseLatitude("30'"), field: "latitude", message: /mixes units/ },
  { name: "seconds mark on the second part", run: () => parseLatitude(`51° 26"`), field: "latitude", message: /mixes units/ },
  { name: "four parts", run: () => parseLatitude("51 30 26 5"), field: "latitude", message: /not a number/ },
  { name: "pair without separator", run: () => parseCoordinatePair("51.5 -2.12"), field: "coordinate", message: /comma/ },
  { name: "pair with three parts", run: () => parseCoordinatePair("1, 2, 3"), field: "coordinate" },
  { name: "pair written longitude first", run: () => parseCoordinatePair("2.12 W, 51.5 N"), field: "latitude", message: /latitude is written first/ },
  { name: "pair with a bad longitude", run: () => parseCoordinatePair("45.5, 200"), field: "longitude", message: /beyond 180/ },
  { name: "slant range: NaN ground", run: () => slantRange({ groundDistance: Number.NaN, heightAgl: 120 }), field: "groundDistance" },
  { name: "slant range: Infinity height", run: () => slantRange({ groundDistance: 10, heightAgl: Infinity }), field: "heightAgl" },
  { name: "slant range: negative ground", run: () => slantRange({ groundDistance: -1, heightAgl: 120 }), field: "groundDistance", message: /negative/ },
  { name: "slant range: negative height", run: () => slantRange({ groundDistance: 1, heightAgl: -0.5 }), field: "heightAgl", message: /negative/ },
  { name: "inverse: latitude 91", run: () => inverse(91, 0, 0, 0), field: "lat1" },
  { name: "inverse: longitude 181", run: () => inverse(0, 181, 0, 0), field: "lon1" },
  { name: "inverse: NaN latitude", run: () => inverse(0, 0, Number.NaN, 0), field: "lat2" },
  { name: "inverse: -Infinity longitude", run: () => inverse(0, 0, 0, -Infinity), field: "lon2" },
  { name: "direct: Infinity bearing", run: () => direct(0, 0, Infinity, 1), field: "bearingDeg" },
  { name: "direct: negative distance", run: () => direct(0, 0, 0, -5), field: "distanceM" },
  { name: "direct: latitude -90.5", run: () => direct(-90.5, 0, 0, 5), field: "lat" },
  { name: "haversine: latitude 91", run: () => haversineDistanceM(0, 0, 91, 0), field: "lat2" },
  { name: "altitude cautions: NaN", run: () => altitudeCautions(Number.NaN), field: "heightAglM" },
  { name: "toDms: latitude 91", run: () => toDms(91, "latitude"), field: "latitude" },
  { name: "formatLength: precision 1.5", run: () => formatLength({ value: 1, unit: "ft" }, 1.5), field: "precision" },
];

describe("bad inputs raise GeoInputError naming the field", () => {
  it.each(cases)("$name", ({ run, field, message }) => {
    let caught: unknown;
    try {
      run();
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(GeoInputError);
    const err = caught as GeoInputError;
    expect(err.name).toBe("GeoInputError");
    expect(err.field).toBe(field);
    if (message) expect(err.message).toMatch(message);
  });
});
