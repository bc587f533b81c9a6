// How many frames a loss took, inferred from the stream's picture structure rather than from
// frame_num alone.
//
// frame_num (ITU-T H.264 section 7.4.3) is 0 at an IDR picture and advances by one after each
// reference picture, modulo MaxFrameNum = 2^(log2_max_frame_num_minus4 + 4). Read alone it has three
// blind spots: (1) a run of frames lost just before an IDR leaves no gap, because the IDR resets
// frame_num to 0; (2) a gap of MaxFrameNum or more wraps (x264 writes MaxFrameNum 16 even for a
// 30-frame GOP, so losing 20 frames reads as 4); (3) a whole group of pictures lost, IDR included,
// shows nothing at all.
//
// Controller encoders write a fixed IDR period, and a picture's position in its group of pictures
// (frames since its IDR) is then bounded by that period. We infer:
// - The IDR period P: the largest number of pictures present between two IDRs that at least two
//   groups of pictures share (a group that lost frames has fewer; one that lost its IDR merges with
//   the next and is seen once). Pictures present plus frame_num gaps measure it, a gap counting only
//   when the picture after it continues the new numbering: a scrambled frame_num must not change the
//   period. Without such a period the structure cannot tell, and every count of
//   a stream that lost frames is a lower bound ("at least").
// - A picture's position in its group: the previous position + 1 + the frames lost between them. A
//   gap g is consistent with frame_num when frame_num = PrevRefFrameNum + g + 1 (mod MaxFrameNum, all
//   pictures being reference pictures), and with the picture order count when the stream has POC
//   type 0 (section 8.2.1.1: pic_order_cnt_lsb advances by a fixed step per frame without B-frames,
//   modulo MaxPicOrderCntLsb); and it must keep the position below P. The smallest consistent g is
//   counted; when several fit (a wrap the period does not rule out), the count is a lower bound.
// - Frames lost at the end of a group: at an IDR, P - 1 - (position of the last slot) slots.
// - Whole groups lost: consecutive IDR pictures of one stream carry different idr_pic_id values
//   (7.4.3). An equal idr_pic_id on two IDRs in a row means at least one IDR (a whole group) was lost
//   between them. Encoders that alternate 0 and 1 (x264 does) tell only "an odd number of groups":
//   one group is counted, as a lower bound. Encoders that count idr_pic_id up tell exactly how many.
// - No gap consistent with the period: the loss went past the end of the group and took the next IDR
//   with it; counted to the picture's smallest possible position in the next group, lower bound.
// Every count is the fewest frames the stream allows. It is called "at least" where the stream itself
// shows that more may be missing (a repeated idr_pic_id, a lost IDR, a frame_num wrap no later IDR
// settles, no period at all). Frames lost at the end of a group before an IDR with the expected
// idr_pic_id are counted exactly: with alternating ids, two more whole groups lost would read the
// same, but nothing in the stream points to them.
// Recovery point SEI (D.2.8) streams refresh without IDRs; with no IDR period they fall back to
// frame_num gaps, which are lower bounds.
import type { TracePicture } from "./signal-trace";

export interface PictureStructure {
  /** Frame slots between two IDR pictures, when the stream keeps a regular period; else null. */
  idrPeriod: number | null;
  /** Every picture seen is a reference picture (frame_num then advances once per frame). */
  allReference: boolean;
  /** pic_order_cnt_lsb step per frame (POC type 0 without reordering), else null. */
  pocStep: number | null;
  /** idr_pic_id alternates 0/1 (x264) rather than counting up. */
  idrIdToggles: boolean;
}

/** The frame_num gap before `p` (8.2.5.2), when the picture after it confirms `p`'s frame_num. */
function confirmedGap(prevRef: number | null, p: TracePicture, next: TracePicture | undefined): number {
  if (prevRef === null || p.isIdr || p.frameNum === null || p.gapsInFrameNumAllowed || !p.isReference) return 0;
  const gap = (p.frameNum - prevRef - 1 + p.maxFrameNum) % p.maxFrameNum;
  if (gap === 0 || p.frameNum === prevRef) return 0;
  if (!next || next.isIdr || next.frameNum !== (p.frameNum + 1) % p.maxFrameNum) return 0;
  return gap;
}

export function inferPictureStructure(pictures: readonly TracePicture[]): PictureStructure {
  let allReference = true;
  const lengths = new Map<number, number>();
  let slotsInGroup = -1;
  const pocDeltas = new Map<number, number>();
  let prevPoc: number | null = null;
  let pocUsable = true;
  const idrIds: number[] = [];
  let prevRef: number | null = null;
  for (let i = 0; i < pictures.length; i++) {
    const p = pictures[i];
    if (p.secondField) continue;
    if (!p.isReference) allReference = false;
    if (p.isIdr) {
      if (slotsInGroup > 0) {
        lengths.set(slotsInGroup, (lengths.get(slotsInGroup) ?? 0) + 1);
      }
      slotsInGroup = 1;
      if (p.idrPicId !== undefined && p.idrPicId !== null) idrIds.push(p.idrPicId);
    } else if (slotsInGroup > 0) {
      slotsInGroup += 1 + confirmedGap(prevRef, p, pictures[i + 1]);
    }
    // An unreadable reference picture still used up one frame_num value.
    if (p.isReference) prevRef = p.isIdr || p.hasMmco5 ? 0 : (p.frameNum ?? (prevRef === null ? null : (prevRef + 1) % p.maxFrameNum));
    // POC type 0: the lsb step between consecutive frames, when it never goes backwards (no reordering).
    if (p.pocLsb === undefined || p.pocLsb === null || !p.maxPocLsb) {
      pocUsable = false;
    } else {
      if (p.isIdr) prevPoc = null;
      if (prevPoc !== null) {
        const d = (p.pocLsb - prevPoc + p.maxPocLsb) % p.maxPocLsb;
        if (d === 0 || d > p.maxPocLsb / 2) pocUsable = false;
        else pocDeltas.set(d, (pocDeltas.get(d) ?? 0) + 1);
      }
      prevPoc = p.pocLsb;
    }
  }
  let idrPeriod: number | null = null;
  for (const [len, count] of lengths) if (count >= 2 && len >= 2 && (idrPeriod === null || len > idrPeriod)) idrPeriod = len;
  let pocStep: number | null = null;
  if (pocUsable && pocDeltas.size > 0) pocStep = Math.min(...pocDeltas.keys());
  const idrIdToggles = idrIds.every((id) => id === 0 || id === 1);
  return { idrPeriod, allReference, pocStep, idrIdToggles };
}

export interface GapReading {
  /** Slots lost before the picture. */
  lost: number;
  /** The count is the smallest of several the stream allows. */
  lowerBound: boolean;
  /** The loss crossed into the next group of pictures (its IDR was lost): the picture's new position. */
  newGroupPosition: number | null;
}

/**
 * Frames lost before non-IDR picture `p`, given the last slot's position `pos` in its group (IDR = 0),
 * the last reference frame_num and the last picture's POC lsb. Only called when the structure has a
 * period and every picture is a reference picture.
 */
export function readGapWithPeriod(
  s: PictureStructure & { idrPeriod: number },
  pos: number,
  prevRef: number,
  prevPoc: number | null,
  p: TracePicture,
  /** Pictures from `p` (included) to the next IDR or the end of the stream: they must fit in the group too. */
  picturesToIdr = 1,
): GapReading {
  const fits = (g: number) => {
    if (p.frameNum !== null && p.frameNum !== (prevRef + g + 1) % p.maxFrameNum) return false;
    if (s.pocStep !== null && prevPoc !== null && p.pocLsb !== null && p.pocLsb !== undefined && p.maxPocLsb) {
      if (p.pocLsb !== (prevPoc + (g + 1) * s.pocStep) % p.maxPocLsb) return false;
    }
    return true;
  };
  const room = s.idrPeriod - 1 - pos; // slots left in this group after `pos`
  // No gap: nothing lost (a loss of exactly MaxFrameNum frames shows up at the group's end instead).
  if (fits(0)) return { lost: 0, lowerBound: false, newGroupPosition: null };
  // A gap: its length must leave room in the group for the pictures still to come before the next
  // IDR; when none does, the gap took the group's end and the next IDR with it.
  const inGroup: number[] = [];
  for (let g = 1; g <= room - picturesToIdr; g++) if (fits(g)) inGroup.push(g);
  if (inGroup.length > 0) return { lost: inGroup[0], lowerBound: inGroup.length > 1, newGroupPosition: null };
  // Past the group's end: its IDR went too. Smallest position k >= 1 in a later group that fits
  // frame_num (frame_num there counts from that lost IDR).
  const tail = Math.max(0, room);
  for (let k = 1; k < s.idrPeriod; k++) {
    if (p.frameNum === null || p.frameNum === k % p.maxFrameNum) return { lost: tail + k, lowerBound: true, newGroupPosition: k };
  }
  return { lost: tail, lowerBound: true, newGroupPosition: 0 };
}
