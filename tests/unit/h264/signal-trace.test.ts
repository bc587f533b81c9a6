import { describe, expect, it } from "vitest";
import {
  FrameFlag,
  FrameState,
  groupTraceIntervals,
  mergeDecoderErrors,
  SignalTraceRecorder,
  summarizeTrace,
  type SignalTrace,
  type TracePicture,
} from "@/lib/h264/signal-trace";

// Sequences built by hand from the frame_num rules of ITU-T H.264 section 7.4.3: frame_num is 0 at an
// IDR picture, advances by one (modulo MaxFrameNum) after each reference picture, and a
// non-reference picture carries PrevRefFrameNum + 1 without advancing it. Section 8.2.5.2: a jump
// beyond that, with gaps_in_frame_num_value_allowed_flag equal to 0, is an unintentional loss.

const MAX = 16;

function pic(frameNum: number | null, over: Partial<TracePicture> = {}): TracePicture {
  return {
    offset: 0,
    isIdr: false,
    isReference: true,
    frameNum,
    maxFrameNum: MAX,
    gapsInFrameNumAllowed: false,
    hasMmco5: false,
    recoveryFrameCnt: null,
    damaged: false,
    secondField: false,
    ...over,
  };
}

/** An IDR every `gop` frames, all frames reference pictures (like x264 baseline output). */
function baselineGop(frames: number, gop = 30): TracePicture[] {
  const out: TracePicture[] = [];
  for (let i = 0; i < frames; i++) {
    const inGop = i % gop;
    out.push(pic(inGop % MAX, { isIdr: inGop === 0, offset: i * 1000 }));
  }
  return out;
}

function record(pictures: TracePicture[]): SignalTrace {
  const recorder = new SignalTraceRecorder();
  for (const p of pictures) recorder.addPicture(p);
  return recorder.finish();
}

const stateString = (t: SignalTrace) => Array.from(t.states, (s) => "IDL"[s]).join("");

describe("SignalTraceRecorder", () => {
  it("marks a clean stream intact, with frame_num wrapping at MaxFrameNum", () => {
    const trace = record(baselineGop(90));
    expect(trace.length).toBe(90);
    expect(stateString(trace)).toBe("I".repeat(90));
    expect(trace.lossEvents).toBe(0);
  });

  it("does not count non-reference frames as gaps (I P b b P b b ...)", () => {
    // Decoding order with non-reference B pictures: B carries PrevRefFrameNum + 1, the next P the same.
    const seq = [pic(0, { isIdr: true })];
    let ref = 0;
    for (let n = 0; n < 20; n++) {
      seq.push(pic((ref + 1) % MAX)); // P
      ref = (ref + 1) % MAX;
      seq.push(pic((ref + 1) % MAX, { isReference: false }));
      seq.push(pic((ref + 1) % MAX, { isReference: false }));
    }
    const trace = record(seq);
    expect(trace.lossEvents).toBe(0);
    expect(stateString(trace)).toBe("I".repeat(61));
  });

  it("inserts lost slots where reference frames are missing and damages frames until the next IDR", () => {
    const seq = baselineGop(60);
    const kept = seq.filter((_, i) => i !== 10 && i !== 11 && i !== 12);
    const trace = record(kept);
    expect(trace.length).toBe(60);
    expect(trace.lossEvents).toBe(1);
    expect(stateString(trace)).toBe("I".repeat(10) + "LLL" + "D".repeat(17) + "I".repeat(30));
    expect(trace.flags[13] & FrameFlag.Propagated).toBeTruthy();
    expect(trace.flags[30] & FrameFlag.Recovery).toBeTruthy();
    expect(Number.isNaN(trace.offsets[10])).toBe(true);
    expect(trace.offsets[13]).toBe(13000);
  });

  it("counts a gap across the frame_num wrap (15 -> 2 loses 0 and 1)", () => {
    const seq = baselineGop(30);
    const trace = record(seq.filter((_, i) => i !== 16 && i !== 17));
    expect(trace.length).toBe(30);
    expect(stateString(trace).slice(14, 19)).toBe("IILLD");
  });

  it("under-counts a loss of MaxFrameNum or more frames (frame_num is modular)", () => {
    const seq = baselineGop(60, 60);
    const trace = record(seq.filter((_, i) => i < 5 || i >= 5 + 18));
    // 18 frames lost, frame_num only shows 18 - 16 = 2.
    expect(trace.length).toBe(60 - 16);
    expect(summarizeTrace(trace, 30).lostFrames).toBe(2);
  });

  it("takes a lone corrupt frame_num for damage, not for a loss", () => {
    const seq = baselineGop(30);
    seq[8] = { ...seq[8], frameNum: 13 }; // bits hit frame_num; neighbours continue 7 -> 9
    const trace = record(seq);
    expect(trace.length).toBe(30);
    expect(trace.lossEvents).toBe(0);
    expect(trace.states[8]).toBe(FrameState.Damaged);
    expect(trace.flags[8] & FrameFlag.OwnDamage).toBeTruthy();
    // a damaged reference picture spoils prediction until the next IDR
    expect(stateString(trace)).toBe("I".repeat(8) + "D".repeat(22));
  });

  it("marks a repeated frame_num damaged without inventing lost frames", () => {
    const seq = baselineGop(30);
    seq.splice(6, 0, { ...seq[5] });
    const trace = record(seq);
    expect(trace.lossEvents).toBe(0);
    expect(trace.states[6]).toBe(FrameState.Damaged);
  });

  it("damages what precedes the first IDR (stream starting mid-GOP)", () => {
    const seq = baselineGop(60).slice(20);
    const trace = record(seq);
    expect(stateString(trace)).toBe("D".repeat(10) + "I".repeat(30));
  });

  it("recovers at the picture a recovery point SEI names (intra refresh, no IDR)", () => {
    const seq: TracePicture[] = [];
    for (let i = 0; i < 40; i++) seq.push(pic(i % MAX, { isIdr: i === 0, recoveryFrameCnt: i > 0 && i % 10 === 0 ? 5 : null }));
    const kept = seq.filter((_, i) => i !== 12);
    const trace = record(kept);
    // loss at 12 -> damaged from 13; next SEI at slot 20 says "correct from 20 + 5"
    expect(stateString(trace)).toBe("I".repeat(12) + "L" + "D".repeat(12) + "I".repeat(15));
    expect(trace.flags[25] & FrameFlag.Recovery).toBeTruthy();
  });

  it("resets frame_num after memory_management_control_operation 5", () => {
    const seq = [pic(0, { isIdr: true }), pic(1), pic(2, { hasMmco5: true }), pic(1), pic(2)];
    const trace = record(seq);
    expect(trace.lossEvents).toBe(0);
    expect(stateString(trace)).toBe("IIIII");
  });

  it("folds the second field of a pair into its frame's slot", () => {
    const seq = [
      pic(0, { isIdr: true }),
      pic(0, { secondField: true }),
      pic(1),
      pic(1, { secondField: true, damaged: true }),
      pic(2),
      pic(2, { secondField: true }),
    ];
    const trace = record(seq);
    expect(trace.length).toBe(3);
    expect(stateString(trace)).toBe("IDD");
  });

  it("ignores frame_num gaps when the SPS allows them", () => {
    const seq = baselineGop(20).map((p) => ({ ...p, gapsInFrameNumAllowed: true }));
    const trace = record(seq.filter((_, i) => i !== 5));
    expect(trace.lossEvents).toBe(0);
    expect(trace.length).toBe(19);
  });

  it("keeps one byte of state per slot for an hour at 30 fps", () => {
    const recorder = new SignalTraceRecorder();
    const frames = 60 * 60 * 30;
    for (let i = 0; i < frames; i++) recorder.addPicture(pic((i % 30) % MAX, { isIdr: i % 30 === 0, offset: i * 2300 }));
    const trace = recorder.finish();
    expect(trace.length).toBe(frames);
    expect(trace.states.byteLength + trace.flags.byteLength + trace.offsets.byteLength).toBe(frames * 10);
  });
});

describe("groupTraceIntervals / summarizeTrace", () => {
  const trace = record(baselineGop(90).filter((_, i) => i < 40 || i > 44));

  it("groups runs into half-open intervals with times at the given rate", () => {
    expect(groupTraceIntervals(trace, 30)).toEqual([
      { state: "intact", startFrame: 0, endFrame: 40, startSec: 0, endSec: 40 / 30 },
      { state: "lost", startFrame: 40, endFrame: 45, startSec: 40 / 30, endSec: 1.5 },
      { state: "damaged", startFrame: 45, endFrame: 60, startSec: 1.5, endSec: 2 },
      { state: "intact", startFrame: 60, endFrame: 90, startSec: 2, endSec: 3 },
    ]);
  });

  it("summarizes shares, first degradation and longest loss", () => {
    const s = summarizeTrace(trace, 30);
    expect(s).toMatchObject({
      totalFrames: 90,
      presentFrames: 85,
      intactFrames: 70,
      damagedFrames: 15,
      lostFrames: 5,
      lossEvents: 1,
      durationSec: 3,
      firstDegradationSec: 40 / 30,
    });
    expect(s.intactShare).toBeCloseTo(70 / 90, 12);
    expect(s.longestLossSec).toBeCloseTo(5 / 30, 12);
    expect(s.longestDegradationSec).toBeCloseTo(20 / 30, 12);
  });

  it("reports no degradation for a clean trace", () => {
    const s = summarizeTrace(record(baselineGop(30)), 25);
    expect(s).toMatchObject({ intactShare: 1, firstDegradationSec: null, longestLossSec: 0, durationSec: 30 / 25 });
  });

  it("refuses a non-positive frame rate", () => {
    expect(() => groupTraceIntervals(trace, 0)).toThrow(RangeError);
  });
});

describe("mergeDecoderErrors", () => {
  it("marks decoder-reported frames damaged and propagates from reference frames to the next IDR", () => {
    const trace = record(baselineGop(60));
    const { trace: merged, agreement } = mergeDecoderErrors(trace, [5, 50]);
    expect(stateString(merged)).toBe("I".repeat(5) + "D".repeat(25) + "I".repeat(20) + "D".repeat(10));
    expect(merged.flags[5] & FrameFlag.DecoderError).toBeTruthy();
    expect(agreement).toEqual({ decoderFrames: 2, confirmed: 0, onlyDecoder: 2, onlyTrace: 0 });
    expect(stateString(trace)).toBe("I".repeat(60)); // input untouched
  });

  it("maps stream frame indexes past lost slots and counts agreement", () => {
    const trace = record(baselineGop(60).filter((_, i) => i !== 10));
    // stream frame 10 is the first present frame after the loss (slot 11), already damaged by the trace
    const { trace: merged, agreement } = mergeDecoderErrors(trace, [10, 10, 40, 999], { propagate: false });
    expect(merged.states[11]).toBe(FrameState.Damaged);
    expect(merged.states[41]).toBe(FrameState.Damaged);
    expect(merged.states[42]).toBe(FrameState.Intact);
    expect(agreement).toMatchObject({ decoderFrames: 2, confirmed: 1, onlyDecoder: 1 });
  });

  it("does not propagate from non-reference frames", () => {
    const seq = baselineGop(10);
    seq[3] = { ...seq[3], isReference: false };
    seq[4] = { ...seq[4], frameNum: 3 };
    for (let i = 5; i < 10; i++) seq[i] = { ...seq[i], frameNum: i - 1 };
    const trace = record(seq);
    expect(trace.lossEvents).toBe(0);
    expect(stateString(mergeDecoderErrors(trace, [3]).trace)).toBe("IIIDIIIIII");
  });
});
