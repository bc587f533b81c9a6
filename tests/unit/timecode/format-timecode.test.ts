import { describe, expect, it } from "vitest";
import Timecode from "smpte-timecode";
import { FRAME_RATES, type FrameRate } from "@/lib/timecode/frame-rate";
import { formatTimecode } from "@/lib/timecode/format-timecode";
import { parseTimecode } from "@/lib/timecode/parse-timecode";
import { TimecodeError } from "@/lib/timecode/timecode-error";
import { resolveTimecodeScheme } from "@/lib/timecode/timecode-scheme";

function errorCode(fn: () => unknown): string | undefined {
  try {
    fn();
  } catch (error) {
    if (error instanceof TimecodeError) return error.code;
    throw error;
  }
  return undefined;
}

describe("SMPTE ST 12-1 worked values (docs/outside-checks.md, Time)", () => {
  // SMPTE ST 12-1 drop-frame at 30000/1001: ;00 and ;01 are skipped at each minute except every tenth.
  it("29.97 DF: frame 17982 is 00:10:00;00 and back", () => {
    expect(formatTimecode(17982, FRAME_RATES.fps29_97)).toBe("00:10:00;00");
    expect(parseTimecode("00:10:00;00", FRAME_RATES.fps29_97)).toBe(17982);
  });

  it("29.97 DF: frame 1800 is 00:01:00;02 and back", () => {
    expect(formatTimecode(1800, FRAME_RATES.fps29_97)).toBe("00:01:00;02");
    expect(parseTimecode("00:01:00;02", FRAME_RATES.fps29_97)).toBe(1800);
  });

  it("29.97 DF: 00:02:00;00 does not exist", () => {
    expect(errorCode(() => parseTimecode("00:02:00;00", FRAME_RATES.fps29_97))).toBe("dropped-label");
    expect(errorCode(() => parseTimecode("00:02:00;01", FRAME_RATES.fps29_97))).toBe("dropped-label");
    // ...and its neighbours do: the last label of minute 1 and the first kept label of minute 2.
    expect(parseTimecode("00:01:59;29", FRAME_RATES.fps29_97) + 1).toBe(parseTimecode("00:02:00;02", FRAME_RATES.fps29_97));
  });

  it("25 fps non-drop: frame 15000 is 00:10:00:00 and back", () => {
    expect(formatTimecode(15000, FRAME_RATES.fps25)).toBe("00:10:00:00");
    expect(parseTimecode("00:10:00:00", FRAME_RATES.fps25)).toBe(15000);
  });
});

describe("drop-frame label skipping (SMPTE ST 12-1)", () => {
  it("every tenth minute keeps ;00 and ;01 at 29.97", () => {
    for (const label of ["00:00:00;00", "00:10:00;00", "00:20:00;01", "01:00:00;00", "23:50:00;01"]) {
      expect(formatTimecode(parseTimecode(label, FRAME_RATES.fps29_97), FRAME_RATES.fps29_97)).toBe(label);
    }
  });

  it("59.94 skips ;00 to ;03 at each non-tenth minute", () => {
    for (const ff of ["00", "01", "02", "03"]) {
      expect(errorCode(() => parseTimecode(`00:01:00;${ff}`, FRAME_RATES.fps59_94))).toBe("dropped-label");
    }
    // minute 00 keeps all 3600 labels, so frame 3600 is the first label of minute 01
    expect(formatTimecode(3600, FRAME_RATES.fps59_94)).toBe("00:01:00;04");
    expect(formatTimecode(35964, FRAME_RATES.fps59_94)).toBe("00:10:00;00");
  });

  it("refuses drop-frame at rates that have none, and ';' labels there", () => {
    expect(errorCode(() => formatTimecode(0, FRAME_RATES.fps25, { dropFrame: true }))).toBe("unsupported-rate");
    expect(errorCode(() => parseTimecode("00:01:00;02", FRAME_RATES.fps30))).toBe("unsupported-rate");
    expect(errorCode(() => formatTimecode(0, { num: 2997, den: 100 }))).toBe("unsupported-rate");
  });

  it("rejects malformed and out-of-range labels and frames past 24 h", () => {
    expect(errorCode(() => parseTimecode("1:00:00:00", FRAME_RATES.fps25))).toBe("malformed");
    expect(errorCode(() => parseTimecode("00:00:00.00", FRAME_RATES.fps25))).toBe("malformed");
    expect(errorCode(() => parseTimecode("00:00:00:25", FRAME_RATES.fps25))).toBe("out-of-range");
    expect(errorCode(() => parseTimecode("24:00:00:00", FRAME_RATES.fps25))).toBe("out-of-range");
    expect(errorCode(() => parseTimecode("00:60:00:00", FRAME_RATES.fps25))).toBe("out-of-range");
    const day = resolveTimecodeScheme(FRAME_RATES.fps29_97).framesPerDay;
    expect(formatTimecode(day - 1, FRAME_RATES.fps29_97)).toBe("23:59:59;29");
    expect(errorCode(() => formatTimecode(day, FRAME_RATES.fps29_97))).toBe("out-of-range");
    expect(errorCode(() => formatTimecode(-1, FRAME_RATES.fps25))).toBe("out-of-range");
  });
});

// Oracle: the independent npm package smpte-timecode 1.3.6 (new Timecode(frameCount, [num, den], dropFrame)).
// It wraps at 24 h where we refuse, so every compared frame stays below one day.
interface OracleCase {
  name: string;
  rate: FrameRate;
  dropFrame: boolean;
  oracleRate: number | [number, number];
}

const cases: OracleCase[] = [
  { name: "29.97 drop-frame", rate: FRAME_RATES.fps29_97, dropFrame: true, oracleRate: [30000, 1001] },
  { name: "59.94 drop-frame", rate: FRAME_RATES.fps59_94, dropFrame: true, oracleRate: [60000, 1001] },
  { name: "29.97 non-drop", rate: FRAME_RATES.fps29_97, dropFrame: false, oracleRate: [30000, 1001] },
  { name: "23.976 non-drop", rate: FRAME_RATES.fps23_976, dropFrame: false, oracleRate: [24000, 1001] },
  { name: "24 non-drop", rate: FRAME_RATES.fps24, dropFrame: false, oracleRate: 24 },
  { name: "25 non-drop", rate: FRAME_RATES.fps25, dropFrame: false, oracleRate: 25 },
  { name: "30 non-drop", rate: FRAME_RATES.fps30, dropFrame: false, oracleRate: 30 },
  { name: "50 non-drop", rate: FRAME_RATES.fps50, dropFrame: false, oracleRate: 50 },
  { name: "60 non-drop", rate: FRAME_RATES.fps60, dropFrame: false, oracleRate: 60 },
];

/** every frame of the first 20,000, a prime stride over the whole day, and a window around every minute start */
function framesToCompare(framesPerDay: number): number[] {
  const frames = new Set<number>();
  for (let f = 0; f <= 20_000; f++) frames.add(f);
  for (let f = 0; f < framesPerDay; f += 997) frames.add(f);
  for (let minute = 0; minute < 1440; minute++) {
    // Proportional position of the minute start; drop-frame counting strays from it by a few
    // frames, so the window is wide enough to hold the real start (asserted below).
    const approx = Math.round((minute * 60 * framesPerDay) / 86_400);
    for (let d = -10; d <= 10; d++) {
      const f = approx + d;
      if (f >= 0 && f < framesPerDay) frames.add(f);
    }
  }
  frames.add(framesPerDay - 1);
  return [...frames];
}

describe.each(cases)("agrees with smpte-timecode: $name", ({ rate, dropFrame, oracleRate }) => {
  const scheme = resolveTimecodeScheme(rate, dropFrame);
  const frames = framesToCompare(scheme.framesPerDay);

  it(`frame -> label over ${frames.length} frames up to 24 h`, () => {
    const minuteStarts = new Set<string>();
    for (const frame of frames) {
      const expected = new Timecode(frame, oracleRate, dropFrame).toString();
      const actual = formatTimecode(frame, rate, { dropFrame });
      if (actual !== expected) expect(`${frame}: ${actual}`).toBe(`${frame}: ${expected}`);
      // first label of each minute: ;00 at tenth minutes, ;02 (;04 at 59.94) at the others
      const m = /^(\d\d):(\d\d):00[:;](\d\d)$/.exec(expected);
      if (m && Number(m[3]) === (dropFrame && Number(m[2]) % 10 !== 0 ? scheme.droppedPerMinute : 0)) minuteStarts.add(expected);
    }
    // The sample really contains the start of all 1440 minutes of the day, skipped labels included.
    expect(minuteStarts.size).toBe(1440);
  });

  it("label -> frame, both parsers reading the oracle's labels", () => {
    for (const frame of frames) {
      const label = new Timecode(frame, oracleRate, dropFrame).toString();
      const oracleFrame = new Timecode(label, oracleRate, dropFrame).frameCount;
      const ours = parseTimecode(label, rate);
      if (ours !== oracleFrame || ours !== frame) expect(`${label}: ${ours}`).toBe(`${label}: ${frame}`);
    }
  });

  it("both refuse exactly the same labels around every minute start", () => {
    const sep = dropFrame ? ";" : ":";
    const pad = (n: number) => String(n).padStart(2, "0");
    let refused = 0;
    for (let hh = 0; hh < 24; hh += 7) {
      for (let mm = 0; mm < 60; mm++) {
        for (let ff = 0; ff < 6; ff++) {
          const label = `${pad(hh)}:${pad(mm)}:00${sep}${pad(ff)}`;
          let oracleRefuses = false;
          try {
            new Timecode(label, oracleRate, dropFrame);
          } catch {
            oracleRefuses = true;
          }
          const ourCode = errorCode(() => parseTimecode(label, rate));
          expect({ label, refused: ourCode === "dropped-label" }).toEqual({ label, refused: oracleRefuses });
          if (oracleRefuses) refused++;
        }
      }
    }
    // 4 hour values x 54 non-tenth minutes x (2 or 4) skipped labels
    expect(refused).toBe(dropFrame ? 4 * 54 * scheme.droppedPerMinute : 0);
  });
});
