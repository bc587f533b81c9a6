import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseTrack } from "@/lib/tracks/parse-track";
import { describeTrackProblem } from "@/lib/tracks/describe-track-problem";
import { readTrackTime } from "@/lib/tracks/read-track-time";
import { MAX_TRACK_BYTES } from "@/lib/tracks/track-types";

const FIXTURES = path.resolve(__dirname, "../../fixtures/tracks");
const read = (name: string) => new Uint8Array(readFileSync(path.join(FIXTURES, name)));
const XSD = path.join(FIXTURES, "gpx-1-1.xsd");

/** Debian's xmllint (libxml2-utils) validating a file against the GPX 1.1 schema: true when it validates. */
function xmllintValidates(file: string): boolean {
  const r = spawnSync("xmllint", ["--noout", "--schema", XSD, path.join(FIXTURES, file)], { encoding: "utf8" });
  return r.status === 0;
}

function refusal(name: string) {
  const r = parseTrack(read(name));
  if (r.ok) throw new Error(`${name} was accepted`);
  return r.problems.map((p) => describeTrackProblem(path.basename(name), p));
}

describe("GPX 1.1 against the schema (xmllint --schema, GPX 1.1 XSD reproduced from memory: tests/fixtures/tracks/README.md)", () => {
  it("xmllint is installed (Debian package libxml2-utils)", () => {
    const r = spawnSync("xmllint", ["--version"], { encoding: "utf8" });
    expect(r.stderr).toMatch(/using libxml version/);
  });

  it("the schema is not a rubber stamp: it refuses a point without lat and an element out of the schema's order", () => {
    const check = (xml: string) => spawnSync("xmllint", ["--noout", "--schema", XSD, "-"], { input: xml, encoding: "utf8" }).status === 0;
    const wrap = (pt: string) => `<?xml version="1.0"?><gpx version="1.1" creator="t" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>${pt}</trkseg></trk></gpx>`;
    expect(check(wrap('<trkpt lat="54.41" lon="-2.62"><ele>1</ele><time>2026-03-14T10:00:00Z</time></trkpt>'))).toBe(true);
    expect(check(wrap('<trkpt lon="-2.62"><time>2026-03-14T10:00:00Z</time></trkpt>'))).toBe(false);
    // the schema's wptType sequence puts <ele> before <time>
    expect(check(wrap('<trkpt lat="54.41" lon="-2.62"><time>2026-03-14T10:00:00Z</time><ele>1</ele></trkpt>'))).toBe(false);
    expect(check(wrap('<trkpt lat="54.41" lon="180"><time>2026-03-14T10:00:00Z</time></trkpt>'))).toBe(false);
  });

  // Cairn accepts only what the schema accepts, and is stricter where a track needs more than GPX
  // requires: times on every point, with a zone, in strict order
  const cases: { file: string; schema: boolean; cairn: boolean }[] = [
    { file: "hand-worked.gpx", schema: true, cairn: true },
    { file: "bad/malformed.gpx", schema: false, cairn: false },
    { file: "bad/latitude-out-of-range.gpx", schema: false, cairn: false },
    { file: "bad/no-times.gpx", schema: true, cairn: false },
    { file: "bad/no-zone.gpx", schema: true, cairn: false },
    { file: "bad/out-of-order.gpx", schema: true, cairn: false },
    { file: "bad/duplicate-times.gpx", schema: true, cairn: false },
  ];
  for (const c of cases) {
    it(`${c.file}: schema ${c.schema ? "valid" : "invalid"}, Cairn ${c.cairn ? "accepts" : "refuses"}`, () => {
      expect(xmllintValidates(c.file)).toBe(c.schema);
      expect(parseTrack(read(c.file)).ok).toBe(c.cairn);
      if (!c.schema) expect(c.cairn).toBe(false);
    });
  }
});

describe("the hand-worked GPX example", () => {
  it("reads every point of every segment, with times, zones, milliseconds and heights worked out by hand", () => {
    const r = parseTrack(read("hand-worked.gpx"));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const { points, heightSource } = r.track;
    // By hand: 1970-01-01 to 2026-01-01 is 56 years with 14 leap days (1972 ... 2024) = 20,454 days;
    // 2026-03-14 is 31 + 28 + 13 = 72 days later: 20,526 days = 1,773,446,400 s; 10:00:00Z adds 36,000 s.
    expect(points.map((p) => p.t)).toEqual([1_773_482_400_000, 1_773_482_401_250, 1_773_482_403_000]);
    // 11:00:01.250+01:00 is 10:00:01.250 UTC (ISO 8601 offset subtracted)
    expect(points.map((p) => [p.lat, p.lon])).toEqual([[54.41301, -2.61955], [54.41401, -2.61955], [54.41401, -2.61855]]);
    // heights above launch = ele - ele of point 1 (212.0): 0, 30.5, 40
    expect(points.map((p) => p.h)).toEqual([0, 30.5, 40]);
    expect(heightSource).toBe("elevation_minus_first");
  });

  it("reads the same flight from CSV, heights in international feet (0.3048 m exactly, NIST SP 811)", () => {
    const r = parseTrack(read("flight.csv"));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.track.points.map((p) => p.t)).toEqual([1_773_482_400_000, 1_773_482_401_250, 1_773_482_403_000]);
    // 100 ft = 30.48 m; 131.234 ft = 40.0001232 m (by hand)
    expect(r.track.points[1].h).toBeCloseTo(30.48, 9);
    expect(r.track.points[2].h).toBeCloseTo(40.0001232, 9);
    expect(r.track.heightSource).toBe("above_launch");
  });
});

describe("bad input: each refusal names the file, the line or point, and the reason", () => {
  it("malformed XML: the line where it breaks", () => {
    const [m] = refusal("bad/malformed.gpx");
    expect(m).toMatch(/^malformed\.gpx, line \d+: the XML is malformed/);
  });
  it("a GPX without times", () => {
    expect(refusal("bad/no-times.gpx")[0]).toBe("no-times.gpx: none of the 2 track points has a <time>; a track without times cannot be matched to a recording");
  });
  it("a time without a zone: line 6, point 2", () => {
    expect(refusal("bad/no-zone.gpx")[0]).toMatch(/^no-zone\.gpx, line 6, point 2: the time "2026-03-14T10:00:01" has no time zone/);
  });
  it("points out of order: line 7, point 3", () => {
    expect(refusal("bad/out-of-order.gpx")[0]).toMatch(/^out-of-order\.gpx, line 7, point 3: the time 2026-03-14T10:00:01\.000Z is earlier than point 2's/);
  });
  it("duplicate times: line 6, point 2", () => {
    expect(refusal("bad/duplicate-times.gpx")[0]).toMatch(/^duplicate-times\.gpx, line 6, point 2: the time 2026-03-14T10:00:00\.000Z is the same as point 1's/);
  });
  it("coordinates out of range: line 6, point 2", () => {
    expect(refusal("bad/latitude-out-of-range.gpx")[0]).toBe("latitude-out-of-range.gpx, line 6, point 2: the latitude 94.41401 is outside -90 to 90 degrees");
  });
  it("a CSV with an unknown column: line 1, the column named, the accepted names listed", () => {
    const [m] = refusal("bad/unknown-column.csv");
    expect(m).toMatch(/^unknown-column\.csv, line 1: the column "speed_kmh" is not one Cairn reads; the accepted names are time, /);
  });
  it("a CSV row with a missing field, a bad number, a longitude of 180", () => {
    const csv = (s: string) => parseTrack(new TextEncoder().encode(s));
    const a = csv("time,lat,lon\n2026-03-14T10:00:00Z,54.41\n");
    expect(!a.ok && a.problems[0]).toMatchObject({ line: 2 });
    const b = csv("time,lat,lon,height_m\n2026-03-14T10:00:00Z,54.41,-2.62,abc\n");
    expect(!b.ok && b.problems[0]).toMatchObject({ line: 2, point: 1, reason: 'the height "abc" is not a number' });
    const c = csv("time,lat,lon\n2026-03-14T10:00:00Z,54.41,180\n");
    expect(!c.ok && c.problems[0].reason).toBe("the longitude 180 is outside -180 to 180 degrees");
  });
  it("a 200 MB file is refused by its size, before anything is read", () => {
    const big = new Uint8Array(200 * 1024 * 1024);
    const r = parseTrack(big);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.problems[0].reason).toBe(`the file is 200.0 MiB; a track may be at most ${(MAX_TRACK_BYTES / 1048576).toFixed(1)} MiB`);
  });
  it("bytes that are not UTF-8, NUL characters and empty files", () => {
    expect(parseTrack(new Uint8Array([0x3c, 0xff, 0xfe])).ok).toBe(false);
    const nul = parseTrack(new TextEncoder().encode("time,lat,lon\n2026-03-14T10:00:00Z,54.41,-2.6\u0000\n"));
    expect(!nul.ok && nul.problems[0]).toMatchObject({ line: 2 });
    expect(parseTrack(new Uint8Array()).ok).toBe(false);
  });
  it("a GPX of another version or namespace is refused", () => {
    const gpx10 = '<?xml version="1.0"?><gpx version="1.0" creator="t" xmlns="http://www.topografix.com/GPX/1/0"><trk><trkseg><trkpt lat="1" lon="1"><time>2026-03-14T10:00:00Z</time></trkpt></trkseg></trk></gpx>';
    const r = parseTrack(new TextEncoder().encode(gpx10));
    expect(!r.ok && r.problems[0].reason).toMatch(/not a GPX 1\.1 file/);
  });
});

describe("track times (xsd:dateTime, W3C XML Schema Part 2, 3.2.7; ISO 8601)", () => {
  it("reads zones and fractions; refuses no zone and impossible dates", () => {
    expect(readTrackTime("2026-03-14T10:00:00Z")).toEqual({ ok: true, ms: 1_773_482_400_000 });
    expect(readTrackTime("2026-03-14T04:30:00.5-05:30")).toEqual({ ok: true, ms: 1_773_482_400_500 });
    expect(readTrackTime("2026-03-14T10:00:00").ok).toBe(false);
    expect(readTrackTime("2026-02-29T10:00:00Z").ok).toBe(false); // 2026 is not a leap year
    expect(readTrackTime("2024-02-29T10:00:00Z").ok).toBe(true);
    // Date.parse agrees where both read the text (ECMAScript date time string format)
    expect((readTrackTime("2026-03-14T10:00:01.250+01:00") as { ms: number }).ms).toBe(Date.parse("2026-03-14T10:00:01.250+01:00"));
  });
});
