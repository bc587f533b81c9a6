import { describe, expect, it } from "vitest";
import { planTimedReencode, slotTimestampExpression } from "@/lib/processing/plan-timed-reencode";

// The setpts expression evaluated the way ffmpeg's expression evaluator reads it (libavutil/eval.c:
// if(x,y,z), lt, eq, round, st/ld memory cells, ';' evaluates left then right), so the balanced
// if-tree can be checked against the slot map for thousands of losses without running ffmpeg. The
// integration tests check ffmpeg's own output (ffprobe -show_frames).
function evaluate(expr: string, vars: { N: number; T: number; TB: number }): number {
  const mem: number[] = [];
  const js = expr.replace(/;/g, ",");
  const f = new Function(
    "IF", "lt", "eq", "round", "st", "ld", "N", "T", "TB",
    `return (${js.replace(/\bif\(/g, "IF(")});`,
  );
  return f(
    (c: number, a: number, b: number) => (c ? a : b),
    (a: number, b: number) => (a < b ? 1 : 0),
    (a: number, b: number) => (a === b ? 1 : 0),
    (x: number) => Math.round(x),
    (i: number, v: number) => (mem[i] = v),
    (i: number) => mem[i],
    vars.N, vars.T, vars.TB,
  );
}

describe("slotTimestampExpression", () => {
  it("puts every present frame at its slot, through 2000 losses of varying length", () => {
    const slots: number[] = [];
    let slot = 0;
    for (let i = 0; i < 20000; i++) {
      if (i % 10 === 5) slot += 1 + (i % 7); // a loss before every 10th frame
      slots.push(slot++);
    }
    const rate = { num: 30000, den: 1001 };
    const expr = slotTimestampExpression(slots, rate);
    const TB = 1 / 90000;
    for (const i of [1, 4, 5, 6, 14, 15, 999, 1005, 12345, 19999]) {
      const T = (i * rate.den) / rate.num;
      const pts = evaluate(expr, { N: i, T, TB });
      // seconds = slot * den / num, in units of TB
      expect(pts * TB).toBeCloseTo((slots[i] * rate.den) / rate.num, 9);
    }
    // the first picture the decoder outputs is at 0, whatever its packet
    expect(evaluate(expr, { N: 0, T: (7 * rate.den) / rate.num, TB })).toBe(0);
  });

  it("a clean map is the identity", () => {
    const slots = Array.from({ length: 100 }, (_, i) => i);
    const expr = slotTimestampExpression(slots, { num: 25, den: 1 });
    expect(evaluate(expr, { N: 40, T: 40 / 25, TB: 1 / 25 })).toBeCloseTo(40, 9);
  });
});

describe("planTimedReencode", () => {
  it("stamps through NUT, then re-encodes to exactly frameSlots frames at a constant rate", () => {
    const plan = planTimedReencode({ presentSlots: [0, 1, 5], frameSlots: 8, rate: { num: 30, den: 1 }, width: 432, height: 240 }, "/tmp/x.filter");
    expect(plan.stamp.inputOptions).toEqual(["-f", "h264", "-r", "30/1"]);
    expect(plan.stamp.outputOptions).toContain("nut");
    expect(plan.outputOptions.join(" ")).toContain("-filter_script:v /tmp/x.filter -fps_mode cfr -r 30/1 -frames:v 8");
    expect(plan.filterScript).toMatch(/^setpts='.*',scale=432:240,tpad=stop_mode=clone:stop=-1$/);
  });
});
