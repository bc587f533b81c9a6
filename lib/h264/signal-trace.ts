// The signal trace: every frame slot of a recording marked intact, damaged or lost, judged from the
// H.264 stream alone (ITU-T H.264 sections 7.4.3 frame_num and 8.2.5.2 gaps in frame_num), and
// optionally merged with the frames a decoder (ffmpeg) reported errors for.
//
// Frame slots are in decoding order. A slot is either a coded frame present in the file or a frame
// inferred to be missing from a frame_num gap. Lost slots count toward time: they stand for the
// moments the radio link dropped, so the trace's timeline is the recorder's, not the playable file's.
//
// Choices made here, on purpose:
// - Frames predicted from a lost or damaged reference are damaged until the next IDR picture, or until
//   the picture a recovery point SEI names: a decoder cannot rebuild them exactly before that.
//   Frames before the stream's first IDR (or recovery point) are damaged for the same reason.
// - Losses are counted from frame_num, read together with the stream's picture structure (its IDR
//   period, picture order count and idr_pic_id; see infer-lost-frames.ts): frames lost at the end of a
//   group of pictures and whole groups are counted too. Where the structure cannot tell (no regular
//   IDR period, a wrap the period does not rule out, a lost IDR), the count is the smallest the
//   stream allows and the trace says it is a lower bound (lostIsLowerBound).
// - A frame_num equal to the previous reference picture's (outside a field pair) is ambiguous: a
//   repeated picture or exactly MaxFrameNum - 1 lost frames. It is marked damaged, with no lost slots.
// - When the SPS allows gaps in frame_num (gaps_in_frame_num_value_allowed_flag), gaps are the
//   encoder's choice and are not counted as losses.

import { inferPictureStructure, readGapWithPeriod, type GapReading, type PictureStructure } from "./infer-lost-frames";

export const FrameState = { Intact: 0, Damaged: 1, Lost: 2 } as const;
export type FrameStateValue = (typeof FrameState)[keyof typeof FrameState];
export type FrameStateName = "intact" | "damaged" | "lost";
const STATE_NAMES: readonly FrameStateName[] = ["intact", "damaged", "lost"];

/** Bits of SignalTrace.flags: why a slot has its state. */
export const FrameFlag = {
  Present: 1,
  Idr: 2,
  Reference: 4,
  /** Prediction restarts here (IDR or recovery point). */
  Recovery: 8,
  /** Damage seen in this frame itself: bad slice header, missing slices, corrupt NAL unit. */
  OwnDamage: 16,
  /** Damaged because it follows a lost or damaged reference before recovery. */
  Propagated: 32,
  /** Reported by the decoder (see mergeDecoderErrors). */
  DecoderError: 64,
} as const;

export interface SignalTrace {
  /** Number of frame slots (present + lost). */
  length: number;
  /** FrameState per slot. */
  states: Uint8Array;
  /** FrameFlag bits per slot. */
  flags: Uint8Array;
  /** Byte offset of the slot's access unit in the file; NaN for lost slots. */
  offsets: Float64Array;
  /** Number of distinct losses. */
  lossEvents: number;
  /** The lost count is "at least": the stream's structure could not bound every loss. */
  lostIsLowerBound: boolean;
  /** What was inferred about the stream's picture structure (null for traces not built by the recorder). */
  structure?: PictureStructure | null;
}

/** What the stream parser knows about one coded picture (one access unit). */
export interface TracePicture {
  /** Byte offset of the access unit (its first NAL unit's start code). */
  offset: number;
  isIdr: boolean;
  isReference: boolean;
  /** null when no slice header of the picture could be read. */
  frameNum: number | null;
  maxFrameNum: number;
  gapsInFrameNumAllowed: boolean;
  /** memory_management_control_operation 5 resets frame_num to 0 for what follows. */
  hasMmco5: boolean;
  /** recovery_frame_cnt of a recovery point SEI in this access unit, else null. */
  recoveryFrameCnt: number | null;
  /** Own evidence of damage (bad header, missing slices, corrupt NAL unit). */
  damaged: boolean;
  /** Second field of a field pair: shares the first field's frame slot. */
  secondField: boolean;
  /** idr_pic_id of an IDR picture (7.4.3), when read. */
  idrPicId?: number | null;
  /** pic_order_cnt_lsb (POC type 0 streams only), when read. */
  pocLsb?: number | null;
  /** MaxPicOrderCntLsb of the active SPS (POC type 0 only). */
  maxPocLsb?: number | null;
}

export interface SignalTraceRecorderOptions {
  /** Damaged reference pictures also damage what follows until recovery. Default true. */
  propagateFromDamagedReferences?: boolean;
}

export class SignalTraceRecorder {
  private states = new Uint8Array(1024);
  private flags = new Uint8Array(1024);
  private offsets = new Float64Array(1024);
  private length = 0;
  private lossEvents = 0;
  private prevRefFrameNum: number | null = null;
  // Starts true: nothing before the first IDR or recovery point can be decoded exactly.
  private awaitingRecovery = true;
  private recoveryAt = Number.POSITIVE_INFINITY;
  private readonly propagate: boolean;
  private held: TracePicture | null = null;
  // Pictures are kept until finish(): the IDR period is known only once the whole stream is read.
  private readonly pictures: TracePicture[] = [];
  /** Pictures from each picture (itself included) to the next IDR or the end of the stream. */
  private readonly picturesToIdr = new Map<TracePicture, number>();
  private structure: PictureStructure | null = null;
  private periodic: (PictureStructure & { idrPeriod: number }) | null = null;
  private lowerBound = false;
  /** Slot of the current group's IDR (or where it must have been), null before the first IDR. */
  private groupStart: number | null = null;
  private prevPoc: number | null = null;
  private prevIdrPicId: number | null = null;
  /** The last loss in the current group whose length frame_num left open (a wrap): slot after it. */
  private openGap: { slotAfter: number; maxFrameNum: number } | null = null;

  constructor(options: SignalTraceRecorderOptions = {}) {
    this.propagate = options.propagateFromDamagedReferences ?? true;
  }

  addPicture(p: TracePicture): void {
    this.pictures.push(p);
  }

  private feed(p: TracePicture): void {
    const held = this.held;
    if (held) {
      this.held = null;
      this.commit(this.judgeHeldGap(held, p));
    }
    if (this.gapBefore(p) > 0) {
      // Wait for the next picture: one corrupt frame_num must not pass for a loss.
      this.held = p;
      return;
    }
    this.commit(p);
  }

  /** Number of reference frames missing before `p` by frame_num, 0 when none or unknown. */
  private gapBefore(p: TracePicture): number {
    if (p.secondField || p.isIdr || p.frameNum === null || p.gapsInFrameNumAllowed) return 0;
    const prev = this.prevRefFrameNum;
    if (prev === null || p.frameNum === prev) return 0;
    return (p.frameNum - prev - 1 + p.maxFrameNum) % p.maxFrameNum;
  }

  /** The loss before `p` read with the stream's structure, when it has a period and the group's start is known. */
  private readGap(p: TracePicture): GapReading | null {
    const s = this.periodic;
    if (!s || this.groupStart === null || this.prevRefFrameNum === null) return null;
    if (p.secondField || p.isIdr || p.frameNum === null || p.gapsInFrameNumAllowed) return null;
    const pos = this.length - 1 - this.groupStart;
    return readGapWithPeriod(s, pos, this.prevRefFrameNum, this.prevPoc, p, this.picturesToIdr.get(p) ?? 1);
  }

  /** Frames lost at the end of the group before IDR `p`, and whole groups lost before it. */
  private lostBeforeIdr(p: TracePicture): number {
    const s = this.periodic;
    let lost = 0;
    if (s && this.groupStart !== null) {
      const pos = this.length - 1 - this.groupStart;
      if (pos < s.idrPeriod - 1) lost += s.idrPeriod - 1 - pos;
      // The group's total loss is known now (period - frames present). When a gap in it could have
      // been longer by whole MaxFrameNum cycles, the frames missing at the end belong there: one loss
      // explains the stream, two would be needed otherwise.
      const open = this.openGap;
      if (open && lost >= open.maxFrameNum) {
        const extra = Math.floor(lost / open.maxFrameNum) * open.maxFrameNum;
        this.insertLost(open.slotAfter, extra);
        lost -= extra;
      }
      const id = p.idrPicId ?? null;
      if (id !== null && this.prevIdrPicId !== null) {
        if (s.idrIdToggles) {
          if (id === this.prevIdrPicId) {
            lost += s.idrPeriod;
            this.lowerBound = true;
          }
        } else {
          const delta = (id - this.prevIdrPicId + 65536) % 65536;
          if (delta > 1) lost += (delta - 1) * s.idrPeriod;
        }
      }
    }
    return lost;
  }

  /**
   * A picture whose frame_num jumps while the next picture continues the sequence as if it had not
   * jumped carries a corrupt frame_num: it is damaged, nothing was lost.
   */
  private judgeHeldGap(held: TracePicture, next: TracePicture): TracePicture {
    if (next.isIdr || next.secondField || next.frameNum === null || this.prevRefFrameNum === null) return held;
    const max = held.maxFrameNum;
    const expected = (this.prevRefFrameNum + 1) % max;
    const refIfExpected = held.isReference ? expected : this.prevRefFrameNum;
    const refIfActual = held.isReference ? held.frameNum! : (held.frameNum! - 1 + max) % max;
    const continuesExpected = next.frameNum === (refIfExpected + 1) % max;
    const continuesActual = next.frameNum === (refIfActual + 1) % max;
    if (continuesExpected && !continuesActual) return { ...held, frameNum: expected, damaged: true };
    return held;
  }

  private commit(p: TracePicture): void {
    if (p.secondField && this.length > 0) {
      this.addSecondField(p);
      return;
    }
    let damaged = p.damaged;
    if (p.isIdr && !p.secondField) {
      const before = this.lostBeforeIdr(p);
      if (before > 0) {
        this.pushLost(before);
        this.lossEvents++;
      }
    }
    if (p.isIdr && !p.secondField) this.openGap = null;
    const reading = this.readGap(p);
    const lost = reading ? reading.lost : this.gapBefore(p);
    // A gap in a group with a known period is settled at the group's IDR (see lostBeforeIdr).
    if (lost > 0 && (!reading || (reading.lowerBound && reading.newGroupPosition !== null))) this.lowerBound = true;
    if (lost > 0 && reading?.newGroupPosition !== null && reading?.newGroupPosition !== undefined && this.prevIdrPicId !== null && this.periodic) {
      // An IDR was lost in this gap: the next one's idr_pic_id follows the lost one's.
      this.prevIdrPicId = this.periodic.idrIdToggles ? 1 - this.prevIdrPicId : (this.prevIdrPicId + 1) % 65536;
    }
    if (lost > 0 && reading?.lowerBound && reading.newGroupPosition === null) this.openGap = { slotAfter: this.length + lost, maxFrameNum: p.maxFrameNum };
    if (lost > 0) {
      this.pushLost(lost);
      this.lossEvents++;
      this.startAwaitingRecovery();
      // 8.2.5.2: the decoder infers "non-existing" frames up to frame_num - 1.
      this.prevRefFrameNum = (p.frameNum! - 1 + p.maxFrameNum) % p.maxFrameNum;
    } else if (!p.secondField && !p.isIdr && p.frameNum !== null && p.frameNum === this.prevRefFrameNum && !p.gapsInFrameNumAllowed) {
      damaged = true;
      this.startAwaitingRecovery();
    }

    const slot = this.reserve();
    this.offsets[slot] = p.offset;
    if (p.isIdr) {
      this.groupStart = slot;
      if (p.idrPicId !== undefined && p.idrPicId !== null) this.prevIdrPicId = p.idrPicId;
    } else if (reading?.newGroupPosition !== null && reading?.newGroupPosition !== undefined) {
      this.groupStart = slot - reading.newGroupPosition;
    }
    this.prevPoc = p.pocLsb ?? null;
    let flags: number = FrameFlag.Present;
    if (p.isIdr) flags |= FrameFlag.Idr;
    if (p.isReference) flags |= FrameFlag.Reference;
    if (p.isIdr) {
      this.awaitingRecovery = false;
      this.recoveryAt = Number.POSITIVE_INFINITY;
      flags |= FrameFlag.Recovery;
    } else if (this.awaitingRecovery && slot >= this.recoveryAt) {
      this.awaitingRecovery = false;
      this.recoveryAt = Number.POSITIVE_INFINITY;
      flags |= FrameFlag.Recovery;
    }
    if (p.recoveryFrameCnt !== null && this.awaitingRecovery) {
      if (p.recoveryFrameCnt === 0) {
        this.awaitingRecovery = false;
        this.recoveryAt = Number.POSITIVE_INFINITY;
        flags |= FrameFlag.Recovery;
      } else {
        this.recoveryAt = Math.min(this.recoveryAt, slot + p.recoveryFrameCnt);
      }
    }
    let state: FrameStateValue = FrameState.Intact;
    if (damaged) {
      flags |= FrameFlag.OwnDamage;
      state = FrameState.Damaged;
    }
    if (this.awaitingRecovery) {
      flags |= FrameFlag.Propagated;
      state = FrameState.Damaged;
    }
    this.flags[slot] = flags;
    this.states[slot] = state;
    if (damaged && p.isReference && this.propagate) this.startAwaitingRecovery();
    this.updatePrevRef(p);
  }

  finish(): SignalTrace {
    this.openGap = null;
    this.structure = inferPictureStructure(this.pictures);
    const s = this.structure;
    this.periodic = s.idrPeriod !== null && s.allReference ? { ...s, idrPeriod: s.idrPeriod } : null;
    let toIdr = 0;
    for (let i = this.pictures.length - 1; i >= 0; i--) {
      const p = this.pictures[i];
      if (p.isIdr) toIdr = 0;
      else if (!p.secondField) toIdr++;
      this.picturesToIdr.set(p, Math.max(1, toIdr));
    }
    for (const p of this.pictures) this.feed(p);
    this.pictures.length = 0;
    this.picturesToIdr.clear();
    if (this.held) {
      this.commit(this.held);
      this.held = null;
    }
    // A gap left open in the last group: no IDR came to settle it.
    if (this.openGap) this.lowerBound = true;
    return {
      length: this.length,
      states: this.states.slice(0, this.length),
      flags: this.flags.slice(0, this.length),
      offsets: this.offsets.slice(0, this.length),
      lossEvents: this.lossEvents,
      // Without a period nothing bounds a loss (nor tells frames lost before an IDR).
      lostIsLowerBound: this.lowerBound || (this.periodic === null && this.lossEvents > 0),
      structure: this.structure,
    };
  }

  private addSecondField(p: TracePicture): void {
    const slot = this.length - 1;
    if (p.damaged) {
      this.flags[slot] |= FrameFlag.OwnDamage;
      this.states[slot] = FrameState.Damaged;
      if (p.isReference && this.propagate) this.startAwaitingRecovery();
    }
    this.updatePrevRef(p);
  }

  private updatePrevRef(p: TracePicture): void {
    if (!p.isReference) return;
    if (p.isIdr || p.hasMmco5) this.prevRefFrameNum = 0;
    else if (p.frameNum !== null) this.prevRefFrameNum = p.frameNum;
    // An unreadable reference picture still used up one frame_num value.
    else if (this.prevRefFrameNum !== null) this.prevRefFrameNum = (this.prevRefFrameNum + 1) % p.maxFrameNum;
  }

  private startAwaitingRecovery(): void {
    this.awaitingRecovery = true;
    this.recoveryAt = Number.POSITIVE_INFINITY;
  }

  /** Inserts `count` lost slots before slot `at`, moving the later slots on. */
  private insertLost(at: number, count: number): void {
    const tail = this.length - at;
    for (let n = 0; n < count; n++) this.reserve();
    this.states.copyWithin(at + count, at, at + tail);
    this.flags.copyWithin(at + count, at, at + tail);
    this.offsets.copyWithin(at + count, at, at + tail);
    this.states.fill(FrameState.Lost, at, at + count);
    this.flags.fill(0, at, at + count);
    this.offsets.fill(Number.NaN, at, at + count);
    if (Number.isFinite(this.recoveryAt) && this.recoveryAt >= at) this.recoveryAt += count;
  }

  private pushLost(count: number): void {
    for (let n = 0; n < count; n++) {
      const slot = this.reserve();
      this.states[slot] = FrameState.Lost;
      this.flags[slot] = 0;
      this.offsets[slot] = Number.NaN;
    }
  }

  private reserve(): number {
    if (this.length === this.states.length) {
      const capacity = this.states.length * 2;
      const states = new Uint8Array(capacity);
      states.set(this.states);
      const flags = new Uint8Array(capacity);
      flags.set(this.flags);
      const offsets = new Float64Array(capacity);
      offsets.set(this.offsets);
      this.states = states;
      this.flags = flags;
      this.offsets = offsets;
    }
    return this.length++;
  }
}

export interface TraceInterval {
  state: FrameStateName;
  /** First slot of the interval. */
  startFrame: number;
  /** One past the last slot (half-open), so endFrame - startFrame is the interval's length. */
  endFrame: number;
  startSec: number;
  endSec: number;
}

/** Runs of equal state, with times at `fps` frames per second from the first slot. */
export function groupTraceIntervals(trace: Pick<SignalTrace, "length" | "states">, fps: number): TraceInterval[] {
  if (!(fps > 0)) throw new RangeError("fps must be a positive number");
  const intervals: TraceInterval[] = [];
  let start = 0;
  for (let i = 1; i <= trace.length; i++) {
    if (i === trace.length || trace.states[i] !== trace.states[start]) {
      intervals.push({
        state: STATE_NAMES[trace.states[start]],
        startFrame: start,
        endFrame: i,
        startSec: start / fps,
        endSec: i / fps,
      });
      start = i;
    }
  }
  return intervals;
}

export interface TraceSummary {
  totalFrames: number;
  presentFrames: number;
  intactFrames: number;
  damagedFrames: number;
  lostFrames: number;
  lossEvents: number;
  /** lostFrames is "at least": see SignalTrace.lostIsLowerBound. */
  lostIsLowerBound: boolean;
  durationSec: number;
  /** Intact slots / all slots; 1 for an empty trace. */
  intactShare: number;
  /** Time of the first slot that is not intact, or null. */
  firstDegradationSec: number | null;
  /** Longest run of lost slots, in seconds (0 when nothing was lost). */
  longestLossSec: number;
  /** Longest run of slots that are not intact (damaged or lost), in seconds. */
  longestDegradationSec: number;
}

export function summarizeTrace(trace: SignalTrace, fps: number): TraceSummary {
  if (!(fps > 0)) throw new RangeError("fps must be a positive number");
  const counts = [0, 0, 0];
  let firstDegradation = -1;
  let lossRun = 0;
  let longestLoss = 0;
  let degradedRun = 0;
  let longestDegraded = 0;
  for (let i = 0; i < trace.length; i++) {
    const s = trace.states[i];
    counts[s]++;
    if (s !== FrameState.Intact && firstDegradation < 0) firstDegradation = i;
    lossRun = s === FrameState.Lost ? lossRun + 1 : 0;
    if (lossRun > longestLoss) longestLoss = lossRun;
    degradedRun = s !== FrameState.Intact ? degradedRun + 1 : 0;
    if (degradedRun > longestDegraded) longestDegraded = degradedRun;
  }
  return {
    totalFrames: trace.length,
    presentFrames: counts[FrameState.Intact] + counts[FrameState.Damaged],
    intactFrames: counts[FrameState.Intact],
    damagedFrames: counts[FrameState.Damaged],
    lostFrames: counts[FrameState.Lost],
    lossEvents: trace.lossEvents,
    lostIsLowerBound: trace.lostIsLowerBound ?? false,
    durationSec: trace.length / fps,
    intactShare: trace.length === 0 ? 1 : counts[FrameState.Intact] / trace.length,
    firstDegradationSec: firstDegradation < 0 ? null : firstDegradation / fps,
    longestLossSec: longestLoss / fps,
    longestDegradationSec: longestDegraded / fps,
  };
}

/** Slot index of each frame present in the file, in file order (stream frame index -> slot). */
export function presentFrameSlots(trace: SignalTrace): Uint32Array {
  let present = 0;
  for (let i = 0; i < trace.length; i++) if (trace.flags[i] & FrameFlag.Present) present++;
  const slots = new Uint32Array(present);
  let n = 0;
  for (let i = 0; i < trace.length; i++) if (trace.flags[i] & FrameFlag.Present) slots[n++] = i;
  return slots;
}

/**
 * Stream frame index (0-based, present frames in file order) of the access unit holding byte
 * `position`, or -1 when the position lies before the first frame.
 */
export function findFrameAtOffset(trace: SignalTrace, slots: Uint32Array, position: number): number {
  let lo = 0;
  let hi = slots.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    if (trace.offsets[slots[mid]] <= position) {
      found = mid;
      lo = mid + 1;
    } else {
      hi = mid - 1;
    }
  }
  return found;
}

export interface DecoderAgreement {
  /** Distinct frames the decoder reported. */
  decoderFrames: number;
  /** Of those, frames the stream trace had already marked damaged. */
  confirmed: number;
  /** Frames only the decoder found (damage inside slice data, invisible to header parsing). */
  onlyDecoder: number;
  /** Frames with own damage in the trace that the decoder did not report. */
  onlyTrace: number;
}

export interface MergeOptions {
  /** A decoder error in a reference frame damages what follows until recovery. Default true. */
  propagate?: boolean;
}

/**
 * Marks the frames a decoder reported (stream frame indexes: 0-based, present frames in file order,
 * as ffmpeg counts packets) damaged, and reports how far the two sources agree. Returns a new trace.
 */
export function mergeDecoderErrors(
  trace: SignalTrace,
  decoderFrameIndexes: Iterable<number>,
  options: MergeOptions = {},
): { trace: SignalTrace; agreement: DecoderAgreement } {
  const propagate = options.propagate ?? true;
  const slots = presentFrameSlots(trace);
  const states = trace.states.slice();
  const flags = trace.flags.slice();
  const reported = new Uint8Array(slots.length);
  const agreement: DecoderAgreement = { decoderFrames: 0, confirmed: 0, onlyDecoder: 0, onlyTrace: 0 };
  for (const index of decoderFrameIndexes) {
    if (!Number.isInteger(index) || index < 0 || index >= slots.length || reported[index]) continue;
    reported[index] = 1;
    agreement.decoderFrames++;
    if (trace.states[slots[index]] === FrameState.Damaged) agreement.confirmed++;
    else agreement.onlyDecoder++;
  }
  // Propagation from any slot runs to the next recovery point, so a later report before that point
  // adds nothing: remembering where the last run ended keeps the merge linear.
  let propagatedUntil = 0;
  for (let f = 0; f < slots.length; f++) {
    const slot = slots[f];
    if (trace.flags[slot] & FrameFlag.OwnDamage && !reported[f]) agreement.onlyTrace++;
    if (!reported[f]) continue;
    flags[slot] |= FrameFlag.DecoderError;
    states[slot] = FrameState.Damaged;
    if (!propagate || !(flags[slot] & FrameFlag.Reference) || slot < propagatedUntil) continue;
    let next = slot + 1;
    for (; next < trace.length; next++) {
      if (flags[next] & FrameFlag.Recovery) break;
      if (states[next] === FrameState.Lost) continue;
      states[next] = FrameState.Damaged;
      flags[next] |= FrameFlag.Propagated;
    }
    propagatedUntil = next;
  }
  return {
    trace: {
      length: trace.length,
      states,
      flags,
      offsets: trace.offsets.slice(),
      lossEvents: trace.lossEvents,
      lostIsLowerBound: trace.lostIsLowerBound,
      structure: trace.structure ?? null,
    },
    agreement,
  };
}
