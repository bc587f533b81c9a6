// Slice header, ITU-T H.264 section 7.3.3 (semantics 7.4.3), read to its end so that corrupt headers
// show up as out-of-range values or overruns. Input: RBSP of the slice NAL unit, header byte included
// (the front of the NAL unit is enough; slice data is not read).

import { RbspBitReader, RbspOverrunError, RbspSyntaxError } from "./bit-reader";
import { NalType } from "./nal-unit-types";
import type { Pps } from "./parse-pps";
import type { Sps } from "./parse-sps";

/** slice_type % 5, Table 7-6. */
export const SliceKind = { P: 0, B: 1, I: 2, SP: 3, SI: 4 } as const;

export interface SliceHeader {
  nalUnitType: number;
  nalRefIdc: number;
  idrPicFlag: boolean;
  firstMbInSlice: number;
  sliceType: number;
  /** slice_type % 5 (see SliceKind). */
  sliceKind: number;
  picParameterSetId: number;
  seqParameterSetId: number;
  colourPlaneId: number | null;
  frameNum: number;
  fieldPicFlag: boolean;
  bottomFieldFlag: boolean;
  idrPicId: number | null;
  picOrderCntLsb: number | null;
  deltaPicOrderCntBottom: number;
  deltaPicOrderCnt: [number, number];
  redundantPicCnt: number;
  directSpatialMvPred: boolean | null;
  numRefIdxL0Active: number;
  numRefIdxL1Active: number;
  noOutputOfPriorPics: boolean | null;
  longTermReference: boolean | null;
  /** True when dec_ref_pic_marking holds memory_management_control_operation 5 (resets frame_num). */
  hasMmco5: boolean;
  cabacInitIdc: number | null;
  sliceQpDelta: number;
  sliceQp: number;
  disableDeblockingFilterIdc: number;
  sliceGroupChangeCycle: number | null;
  /** First macroblock address covered: first_mb_in_slice * (1 + MbaffFrameFlag). */
  firstMbAddress: number;
  /** Macroblocks in this picture (a field holds half of a frame's). */
  picSizeInMbs: number;
}

export type SliceHeaderResult =
  | { ok: true; header: SliceHeader }
  | {
      ok: false;
      error: string;
      /** True when the bits ran out before the header ended (front of a NAL unit given, or a cut slice). */
      overrun: boolean;
      /** True when the PPS or SPS the slice refers to has not been seen (e.g. a stream cut before them). */
      missingParameterSet: boolean;
      /** Fields read before the failure. */
      partial: { firstMbInSlice?: number; sliceType?: number; picParameterSetId?: number; frameNum?: number };
    };

export interface ParameterSets {
  sps: ReadonlyMap<number, Sps>;
  pps: ReadonlyMap<number, Pps>;
}

class SliceHeaderError extends Error {}
class MissingParameterSetError extends Error {}

function check(condition: boolean, message: string): void {
  if (!condition) throw new SliceHeaderError(message);
}

function skipRefPicListModification(r: RbspBitReader): void {
  if (!r.readFlag()) return;
  for (let n = 0; ; n++) {
    check(n <= 33, "too many ref_pic_list_modification entries");
    const idc = r.readUe();
    if (idc === 3) return;
    // Values 4 and 5 exist only in the MVC variant of this syntax (nal_unit_type 20), which we do not parse.
    check(idc <= 2, "modification_of_pic_nums_idc out of range");
    r.readUe(); // abs_diff_pic_num_minus1 or long_term_pic_num
  }
}

function skipPredWeightTable(r: RbspBitReader, chromaArrayType: number, l0: number, l1: number, isB: boolean): void {
  check(r.readUe() <= 7, "luma_log2_weight_denom > 7");
  if (chromaArrayType !== 0) check(r.readUe() <= 7, "chroma_log2_weight_denom > 7");
  const lists = isB ? [l0, l1] : [l0];
  for (const count of lists) {
    for (let i = 0; i < count; i++) {
      if (r.readFlag()) {
        const weight = r.readSe();
        const offset = r.readSe();
        check(weight >= -128 && weight <= 127 && offset >= -128 && offset <= 127, "luma weight out of range");
      }
      if (chromaArrayType !== 0 && r.readFlag()) {
        for (let j = 0; j < 2; j++) {
          const weight = r.readSe();
          const offset = r.readSe();
          check(weight >= -128 && weight <= 127 && offset >= -128 && offset <= 127, "chroma weight out of range");
        }
      }
    }
  }
}

export function parseSliceHeader(rbsp: Uint8Array, sets: ParameterSets): SliceHeaderResult {
  const partial: Extract<SliceHeaderResult, { ok: false }>["partial"] = {};
  const r = new RbspBitReader(rbsp);
  try {
    const headerByte = r.readBits(8);
    const nalRefIdc = (headerByte >>> 5) & 0x03;
    const nalUnitType = headerByte & 0x1f;
    const idrPicFlag = nalUnitType === NalType.SliceIdr;

    const firstMbInSlice = r.readUe();
    partial.firstMbInSlice = firstMbInSlice;
    const sliceType = r.readUe();
    check(sliceType <= 9, "slice_type > 9");
    partial.sliceType = sliceType;
    const sliceKind = sliceType % 5;
    const picParameterSetId = r.readUe();
    partial.picParameterSetId = picParameterSetId;
    check(picParameterSetId <= 255, "pic_parameter_set_id > 255");
    const p = sets.pps.get(picParameterSetId);
    if (!p) throw new MissingParameterSetError(`slice refers to unknown PPS ${picParameterSetId}`);
    const s = sets.sps.get(p.seqParameterSetId);
    if (!s) throw new MissingParameterSetError(`PPS ${picParameterSetId} refers to unknown SPS ${p.seqParameterSetId}`);
    // 7.4.3: an IDR picture holds only I (or SI) slices; a non-reference picture is never an IDR.
    if (idrPicFlag) {
      check(sliceKind === SliceKind.I || sliceKind === SliceKind.SI, "IDR slice that is not I or SI");
      check(nalRefIdc !== 0, "IDR slice with nal_ref_idc 0");
    }

    const colourPlaneId = s.separateColourPlane ? r.readBits(2) : null;
    if (colourPlaneId !== null) check(colourPlaneId <= 2, "colour_plane_id > 2");
    const frameNum = r.readBits(s.log2MaxFrameNum);
    partial.frameNum = frameNum;
    if (idrPicFlag) check(frameNum === 0, "IDR slice with frame_num != 0");
    let fieldPicFlag = false;
    let bottomFieldFlag = false;
    if (!s.frameMbsOnly) {
      fieldPicFlag = r.readFlag();
      if (fieldPicFlag) bottomFieldFlag = r.readFlag();
    }
    const mbaffFrameFlag = s.mbAdaptiveFrameField && !fieldPicFlag;
    const picSizeInMbs = s.frameSizeInMbs / (fieldPicFlag ? 2 : 1);
    const firstMbAddress = firstMbInSlice * (mbaffFrameFlag ? 2 : 1);
    check(firstMbAddress < picSizeInMbs, "first_mb_in_slice beyond the picture");

    const idrPicId = idrPicFlag ? r.readUe() : null;
    if (idrPicId !== null) check(idrPicId <= 65535, "idr_pic_id > 65535");
    let picOrderCntLsb: number | null = null;
    let deltaPicOrderCntBottom = 0;
    const deltaPicOrderCnt: [number, number] = [0, 0];
    if (s.picOrderCntType === 0) {
      picOrderCntLsb = r.readBits(s.log2MaxPicOrderCntLsb ?? 4);
      if (p.bottomFieldPicOrderInFramePresent && !fieldPicFlag) deltaPicOrderCntBottom = r.readSe();
    }
    if (s.picOrderCntType === 1 && !s.deltaPicOrderAlwaysZero) {
      deltaPicOrderCnt[0] = r.readSe();
      if (p.bottomFieldPicOrderInFramePresent && !fieldPicFlag) deltaPicOrderCnt[1] = r.readSe();
    }
    let redundantPicCnt = 0;
    if (p.redundantPicCntPresent) {
      redundantPicCnt = r.readUe();
      check(redundantPicCnt <= 127, "redundant_pic_cnt > 127");
    }
    const isB = sliceKind === SliceKind.B;
    const isP = sliceKind === SliceKind.P || sliceKind === SliceKind.SP;
    const directSpatialMvPred = isB ? r.readFlag() : null;
    let numRefIdxL0Active = p.numRefIdxL0DefaultActive;
    let numRefIdxL1Active = p.numRefIdxL1DefaultActive;
    if (isP || isB) {
      if (r.readFlag()) {
        numRefIdxL0Active = r.readUe() + 1;
        if (isB) numRefIdxL1Active = r.readUe() + 1;
      }
      // 7.4.3: at most 16 references for a frame, 32 for a field.
      const limit = fieldPicFlag ? 32 : 16;
      check(numRefIdxL0Active <= limit && (!isB || numRefIdxL1Active <= limit), "num_ref_idx_active too large");
    }
    if (sliceKind !== SliceKind.I && sliceKind !== SliceKind.SI) {
      skipRefPicListModification(r);
      if (isB) skipRefPicListModification(r);
    }
    if ((p.weightedPredFlag && isP) || (p.weightedBipredIdc === 1 && isB)) {
      skipPredWeightTable(r, s.chromaArrayType, numRefIdxL0Active, numRefIdxL1Active, isB);
    }

    let noOutputOfPriorPics: boolean | null = null;
    let longTermReference: boolean | null = null;
    let hasMmco5 = false;
    if (nalRefIdc !== 0) {
      if (idrPicFlag) {
        noOutputOfPriorPics = r.readFlag();
        longTermReference = r.readFlag();
      } else if (r.readFlag()) {
        for (let n = 0; ; n++) {
          check(n <= 66, "too many memory_management_control_operation entries");
          const mmco = r.readUe();
          if (mmco === 0) break;
          check(mmco <= 6, "memory_management_control_operation > 6");
          if (mmco === 5) hasMmco5 = true;
          if (mmco === 1 || mmco === 3) r.readUe(); // difference_of_pic_nums_minus1
          if (mmco === 2) r.readUe(); // long_term_pic_num
          if (mmco === 3 || mmco === 6) r.readUe(); // long_term_frame_idx
          if (mmco === 4) r.readUe(); // max_long_term_frame_idx_plus1
        }
      }
    }

    let cabacInitIdc: number | null = null;
    if (p.entropyCodingModeFlag && sliceKind !== SliceKind.I && sliceKind !== SliceKind.SI) {
      cabacInitIdc = r.readUe();
      check(cabacInitIdc <= 2, "cabac_init_idc > 2");
    }
    const sliceQpDelta = r.readSe();
    const sliceQp = p.picInitQp + sliceQpDelta;
    const qpBdOffsetY = 6 * (s.bitDepthLuma - 8);
    check(sliceQp >= -qpBdOffsetY && sliceQp <= 51, "SliceQPY out of range");
    if (sliceKind === SliceKind.SP || sliceKind === SliceKind.SI) {
      if (sliceKind === SliceKind.SP) r.skipBits(1); // sp_for_switch_flag
      const qs = p.picInitQs + r.readSe();
      check(qs >= 0 && qs <= 51, "QSY out of range");
    }
    let disableDeblockingFilterIdc = 0;
    if (p.deblockingFilterControlPresent) {
      disableDeblockingFilterIdc = r.readUe();
      check(disableDeblockingFilterIdc <= 2, "disable_deblocking_filter_idc > 2");
      if (disableDeblockingFilterIdc !== 1) {
        const alpha = r.readSe();
        const beta = r.readSe();
        check(alpha >= -6 && alpha <= 6 && beta >= -6 && beta <= 6, "deblocking offsets out of range");
      }
    }
    let sliceGroupChangeCycle: number | null = null;
    if (p.numSliceGroups > 1 && p.sliceGroupMapType !== null && p.sliceGroupMapType >= 3 && p.sliceGroupMapType <= 5) {
      const rate = p.sliceGroupChangeRate ?? 1;
      const bits = Math.ceil(Math.log2(s.picSizeInMapUnits / rate + 1));
      sliceGroupChangeCycle = r.readBits(bits);
    }

    return {
      ok: true,
      header: {
        nalUnitType,
        nalRefIdc,
        idrPicFlag,
        firstMbInSlice,
        sliceType,
        sliceKind,
        picParameterSetId,
        seqParameterSetId: s.seqParameterSetId,
        colourPlaneId,
        frameNum,
        fieldPicFlag,
        bottomFieldFlag,
        idrPicId,
        picOrderCntLsb,
        deltaPicOrderCntBottom,
        deltaPicOrderCnt,
        redundantPicCnt,
        directSpatialMvPred,
        numRefIdxL0Active,
        numRefIdxL1Active,
        noOutputOfPriorPics,
        longTermReference,
        hasMmco5,
        cabacInitIdc,
        sliceQpDelta,
        sliceQp,
        disableDeblockingFilterIdc,
        sliceGroupChangeCycle,
        firstMbAddress,
        picSizeInMbs,
      },
    };
  } catch (error) {
    if (
      error instanceof SliceHeaderError ||
      error instanceof MissingParameterSetError ||
      error instanceof RbspSyntaxError ||
      error instanceof RbspOverrunError
    ) {
      return {
        ok: false,
        error: error.message,
        overrun: error instanceof RbspOverrunError,
        missingParameterSet: error instanceof MissingParameterSetError,
        partial,
      };
    }
    throw error;
  }
}
