// Section 7.4.1.2.4 of ITU-T H.264: how a decoder tells that a VCL NAL unit starts a new primary coded
// picture by comparing its slice header with the previous slice's.

import type { SliceHeader } from "./parse-slice-header";

export function isFirstSliceOfNewPicture(prev: SliceHeader, cur: SliceHeader, picOrderCntType: number): boolean {
  if (cur.frameNum !== prev.frameNum) return true;
  if (cur.picParameterSetId !== prev.picParameterSetId) return true;
  if (cur.fieldPicFlag !== prev.fieldPicFlag) return true;
  if (cur.fieldPicFlag && cur.bottomFieldFlag !== prev.bottomFieldFlag) return true;
  if ((cur.nalRefIdc === 0) !== (prev.nalRefIdc === 0)) return true;
  if (picOrderCntType === 0) {
    if (cur.picOrderCntLsb !== prev.picOrderCntLsb) return true;
    if (cur.deltaPicOrderCntBottom !== prev.deltaPicOrderCntBottom) return true;
  } else if (picOrderCntType === 1) {
    if (cur.deltaPicOrderCnt[0] !== prev.deltaPicOrderCnt[0]) return true;
    if (cur.deltaPicOrderCnt[1] !== prev.deltaPicOrderCnt[1]) return true;
  }
  if (cur.idrPicFlag !== prev.idrPicFlag) return true;
  if (cur.idrPicFlag && prev.idrPicFlag && cur.idrPicId !== prev.idrPicId) return true;
  return false;
}
