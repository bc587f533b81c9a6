import { describe, expect, it } from "vitest";
import { buildRangeChecksCsv, RANGE_CHECK_CSV_HEADER, type RangeCheckExportRow } from "@/lib/range-checks/build-range-checks-csv";
import { feetToMetres, slantRange } from "@/lib/geo";

const base: RangeCheckExportRow = {
  id: "7d3f2a10-0000-4000-8000-000000000001",
  flownOn: "2026-03-14",
  jobTitle: "Valve tower annual inspection",
  siteName: "Lowfen reservoir valve tower",
  flightAircraft: "Quad (demo airframe A)",
  recordingName: "flight_0003.264",
  event: "first_degradation",
  atSec: 12.4,
  latitude: 54.4101234567,
  longitude: -2.6251234567,
  groundDistanceM: feetToMetres(1926),
  bearingDeg: 214.123,
  heightAglM: feetToMetres(400),
  slantRangeM: slantRange({ groundDistance: feetToMetres(1926), heightAgl: feetToMetres(400) }),
  antennaOrientation: "Vertical",
  cameraOrientation: "Pitched up 20°",
  aircraft: null,
  firmware: "demo-fw 2.1.0",
  notes: 'Break-up behind the tower, "as usual"',
  createdAt: new Date("2026-03-14T10:15:00.000Z"),
};

/** Splits one simple record (no line breaks inside fields) on commas outside quotes. */
function fieldsOf(line: string): string[] {
  return line.match(/("(?:[^"]|"")*"|[^,]*)(,|$)/g)!.slice(0, -1).map((f) => f.replace(/,$/, ""));
}

describe("buildRangeChecksCsv", () => {
  const csv = buildRangeChecksCsv([base]);
  const [header, record, end] = csv.split("\r\n");

  it("writes a header with a unit in every length column, then one record per check", () => {
    expect(end).toBe("");
    expect(fieldsOf(header)).toHaveLength(RANGE_CHECK_CSV_HEADER.length);
    for (const h of RANGE_CHECK_CSV_HEADER.filter((h) => /distance|Height|Slant/.test(h))) expect(h).toMatch(/\((m|ft)\)$/);
  });

  it("writes each length in metres and in feet, the feet exact (1 ft = 0.3048 m, NIST SP 811)", () => {
    const f = fieldsOf(record);
    const col = (name: string) => f[RANGE_CHECK_CSV_HEADER.indexOf(name as (typeof RANGE_CHECK_CSV_HEADER)[number])];
    expect(col("Ground distance (ft)")).toBe("1926");
    expect(col("Ground distance (m)")).toBe("587.045"); // 1926 * 0.3048 = 587.0448
    expect(col("Height AGL (ft)")).toBe("400");
    expect(col("Height AGL (m)")).toBe("121.92");
    // common practice, no published source: 400 ft AGL over 1926 ft -> 1967.1 ft
    expect(Number(col("Slant range (ft)")).toFixed(1)).toBe("1967.1");
    expect(col("Latitude (deg)")).toBe("54.4101235");
    expect(col("Longitude (deg)")).toBe("-2.6251235");
    expect(col("Link event")).toBe('"Picture breaking up"');
    expect(col("Aircraft")).toBe('"Quad (demo airframe A)"'); // the flight's, when the check names none
    expect(col("Notes")).toBe('"Break-up behind the tower, ""as usual"""');
    expect(col("Recorded at (UTC)")).toBe('"2026-03-14T10:15:00.000Z"');
  });

  it("carries the radio-range caution in its header and the altitude caution on a check above 120 m (lib/geo/cautions.ts)", () => {
    const last = fieldsOf(header).at(-1)!;
    expect(last).toContain("Range figures describe the radio link, not permission to fly that far.");
    expect(last).toContain("the pilot in command decide");
    // 400 ft = 121.92 m AGL, above the lower common limit of 120 m
    expect(fieldsOf(record).at(-1)).toContain("Above 120 m (about 400 ft) above ground level");
    const low = fieldsOf(buildRangeChecksCsv([{ ...base, heightAglM: 61 }]).split("\r\n")[1]);
    expect(low.join(",")).not.toContain("Caution");
  });

  it("guards typed text that a spreadsheet would run, in any text column", () => {
    const out = buildRangeChecksCsv([{ ...base, notes: "=HYPERLINK(\"http://x.invalid\")", firmware: "@SUM(A1)", cameraOrientation: "-45°", aircraft: "+quad" }]);
    expect(out).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);
    expect(out).toContain(`"'@SUM(A1)"`);
    expect(out).toContain(`"'-45°"`);
    expect(out).toContain(`"'+quad"`);
  });

  it("leaves missing figures empty and writes only the header for no checks", () => {
    const f = fieldsOf(buildRangeChecksCsv([{ ...base, latitude: null, longitude: null, bearingDeg: null, atSec: null, recordingName: null }]).split("\r\n")[1]);
    expect(f[RANGE_CHECK_CSV_HEADER.indexOf("Latitude (deg)")]).toBe("");
    expect(f[RANGE_CHECK_CSV_HEADER.indexOf("Recording")]).toBe("");
    expect(buildRangeChecksCsv([]).split("\r\n")).toHaveLength(2);
  });
});
