import { describe, expect, it } from "vitest";
import { inferPictureStructure } from "@/lib/h264/infer-lost-frames";
import { SignalTraceRecorder, type SignalTrace, type TracePicture } from "@/lib/h264/signal-trace";

// Sequences built from ITU-T H.264 section 7.4.3: frame_num is 0 at an IDR and advances by one per
// reference picture modulo MaxFrameNum; consecutive IDR pictures carry different idr_pic_id values
// (x264 alternates 0 and 1). MaxFrameNum 16 with a 30-frame group is what x264 writes for -g 30.

const MAX = 16;

function stream(frames: number, gop = 30, over: (i: number) => Partial<TracePicture> = () => ({})): TracePicture[] {
  const out: TracePicture[] = [];
  for (let i = 0; i < frames; i++) {
    const inGop = i % gop;
    out.push({
      offset: i * 1000,
      isIdr: inGop === 0,
      isReference: true,
      frameNum: inGop % MAX,
      maxFrameNum: MAX,
      gapsInFrameNumAllowed: false,
      hasMmco5: false,
      recoveryFrameCnt: null,
      damaged: false,
      secondField: false,
      idrPicId: inGop === 0 ? Math.floor(i / gop) % 2 : null,
      ...over(i),
    });
  }
  return out;
}

function record(pictures: TracePicture[]): SignalTrace {
  const r = new SignalTraceRecorder();
  for (const p of pictures) r.addPicture(p);
  return r.finish();
}

const without = (pics: TracePicture[], from: number, to: number) => pics.filter((_, i) => i < from || i >= to);
const lostSlots = (t: SignalTrace) => Array.from(t.states).flatMap((s, i) => (s === 2 ? [i] : []));
const range = (from: number, to: number) => Array.from({ length: to - from }, (_, i) => from + i);

describe("inferPictureStructure", () => {
  it("finds the IDR period, all-reference pictures and x264's alternating idr_pic_id", () => {
    const s = inferPictureStructure(stream(150));
    expect(s).toMatchObject({ idrPeriod: 30, allReference: true, idrIdToggles: true, pocStep: null });
  });

  it("has no period with fewer than two agreeing groups", () => {
    expect(inferPictureStructure(stream(50)).idrPeriod).toBeNull();
  });
});

describe("lost frames with a known IDR period", () => {
  it("counts frames lost at the end of a group, before an IDR, exactly and in place", () => {
    const t = record(without(stream(150), 25, 30));
    expect(t.length).toBe(150);
    expect(lostSlots(t)).toEqual(range(25, 30));
    expect(t.lostIsLowerBound).toBe(false);
  });

  it("counts a mid-group loss longer than MaxFrameNum (20 frames, frame_num wraps) exactly", () => {
    const t = record(without(stream(150), 33, 53));
    expect(t.length).toBe(150);
    expect(lostSlots(t)).toEqual(range(33, 53));
    expect(t.lostIsLowerBound).toBe(false);
    expect(t.lossEvents).toBe(1);
  });

  it("counts a run over a whole group (IDR included) and says it is a lower bound", () => {
    // End of group 1 (55..59), all of group 2 (60..89): the IDRs at 30 and 90 both carry idr_pic_id 1.
    const t = record(without(stream(180), 55, 90));
    expect(t.length).toBe(180);
    expect(lostSlots(t)).toEqual(range(55, 90));
    expect(t.lostIsLowerBound).toBe(true);
  });

  it("counts a loss that took the next IDR (no IDR between) as at least the smallest position", () => {
    // 50..64 lost: the IDR at 60 is gone; frame 65 has frame_num 5 in the new group.
    const t = record(without(stream(180), 50, 65));
    expect(t.length).toBe(180);
    expect(lostSlots(t)).toEqual(range(50, 65));
    expect(t.lostIsLowerBound).toBe(true);
  });

  it("counts scattered single losses exactly", () => {
    const kept = stream(150).filter((_, i) => ![7, 41, 77, 118].includes(i));
    const t = record(kept);
    expect(lostSlots(t)).toEqual([7, 41, 77, 118]);
    expect(t.lostIsLowerBound).toBe(false);
  });

  it("uses pic_order_cnt_lsb (POC type 0) to count lost non-reference frames", () => {
    // I p p p ... where only every other frame is a reference picture would hide lost non-reference
    // frames from frame_num; POC lsb (step 2, 8.2.1.1) shows them. Here all are reference pictures
    // but frame_num is made uninformative by a repeated value, so only POC can place the loss.
    const pics = stream(150, 30, (i) => ({ pocLsb: ((i % 30) * 2) % 64, maxPocLsb: 64 }));
    expect(inferPictureStructure(pics).pocStep).toBe(2);
    const t = record(without(pics, 40, 43));
    expect(lostSlots(t)).toEqual(range(40, 43));
  });
});

describe("lost frames without a known period", () => {
  it("says 'at least' when nothing bounds the loss (one IDR, frame_num wraps)", () => {
    // A single group: 20 frames lost read as 4 by frame_num, and the structure cannot tell otherwise.
    const t = record(without(stream(100, 1000), 30, 50));
    expect(t.lostIsLowerBound).toBe(true);
    expect(lostSlots(t).length).toBe(4);
  });

  it("a clean stream is exact", () => {
    const t = record(stream(100, 1000));
    expect(t.lostIsLowerBound).toBe(false);
    expect(lostSlots(t)).toEqual([]);
  });
});
