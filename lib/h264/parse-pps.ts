// Picture parameter set, ITU-T H.264 section 7.3.2.2 (semantics 7.4.2.2).
// Input: RBSP of the NAL unit (emulation prevention removed), header byte included.

import { RbspBitReader, RbspSyntaxError } from "./bit-reader";
import { skipScalingList } from "./parse-sps";

export interface Pps {
  picParameterSetId: number;
  seqParameterSetId: number;
  entropyCodingModeFlag: boolean;
  bottomFieldPicOrderInFramePresent: boolean;
  numSliceGroups: number;
  sliceGroupMapType: number | null;
  /** SliceGroupChangeRate (slice_group_change_rate_minus1 + 1) for map types 3..5. */
  sliceGroupChangeRate: number | null;
  numRefIdxL0DefaultActive: number;
  numRefIdxL1DefaultActive: number;
  weightedPredFlag: boolean;
  weightedBipredIdc: number;
  picInitQp: number;
  picInitQs: number;
  chromaQpIndexOffset: number;
  deblockingFilterControlPresent: boolean;
  constrainedIntraPred: boolean;
  redundantPicCntPresent: boolean;
  transform8x8Mode: boolean;
  picScalingMatrixPresent: boolean;
  secondChromaQpIndexOffset: number;
}

function fail(message: string): never {
  throw new RbspSyntaxError(`PPS: ${message}`);
}

export interface ParsePpsOptions {
  /**
   * chroma_format_idc of the referenced SPS: sizes the optional scaling lists at the end of the PPS.
   * Defaults to 1 (4:2:0). The fields a slice header needs come before that part.
   */
  chromaFormatIdc?: number;
  /** False when `rbsp` is only the front of the NAL unit: the optional trailing part is then skipped. */
  complete?: boolean;
}

export function parsePps(rbsp: Uint8Array, options: ParsePpsOptions = {}): Pps {
  const r = new RbspBitReader(rbsp);
  r.skipBits(8); // NAL header
  const picParameterSetId = r.readUe();
  if (picParameterSetId > 255) fail("pic_parameter_set_id > 255");
  const seqParameterSetId = r.readUe();
  if (seqParameterSetId > 31) fail("seq_parameter_set_id > 31");
  const entropyCodingModeFlag = r.readFlag();
  const bottomFieldPicOrderInFramePresent = r.readFlag();
  const numSliceGroups = r.readUe() + 1;
  if (numSliceGroups > 8) fail("num_slice_groups_minus1 > 7");
  let sliceGroupMapType: number | null = null;
  let sliceGroupChangeRate: number | null = null;
  if (numSliceGroups > 1) {
    sliceGroupMapType = r.readUe();
    if (sliceGroupMapType > 6) fail("slice_group_map_type > 6");
    if (sliceGroupMapType === 0) {
      for (let g = 0; g < numSliceGroups; g++) r.readUe(); // run_length_minus1
    } else if (sliceGroupMapType === 2) {
      for (let g = 0; g < numSliceGroups - 1; g++) {
        r.readUe(); // top_left
        r.readUe(); // bottom_right
      }
    } else if (sliceGroupMapType >= 3 && sliceGroupMapType <= 5) {
      r.skipBits(1); // slice_group_change_direction_flag
      sliceGroupChangeRate = r.readUe() + 1;
    } else if (sliceGroupMapType === 6) {
      const picSizeInMapUnits = r.readUe() + 1;
      const bits = Math.ceil(Math.log2(numSliceGroups));
      r.skipBits(picSizeInMapUnits * bits); // slice_group_id[i]
    }
  }
  const numRefIdxL0DefaultActive = r.readUe() + 1;
  const numRefIdxL1DefaultActive = r.readUe() + 1;
  if (numRefIdxL0DefaultActive > 32 || numRefIdxL1DefaultActive > 32) fail("num_ref_idx default > 32");
  const weightedPredFlag = r.readFlag();
  const weightedBipredIdc = r.readBits(2);
  if (weightedBipredIdc > 2) fail("weighted_bipred_idc == 3");
  const picInitQp = 26 + r.readSe();
  const picInitQs = 26 + r.readSe();
  const chromaQpIndexOffset = r.readSe();
  if (chromaQpIndexOffset < -12 || chromaQpIndexOffset > 12) fail("chroma_qp_index_offset out of range");
  const deblockingFilterControlPresent = r.readFlag();
  const constrainedIntraPred = r.readFlag();
  const redundantPicCntPresent = r.readFlag();

  let transform8x8Mode = false;
  let picScalingMatrixPresent = false;
  let secondChromaQpIndexOffset = chromaQpIndexOffset;
  if (options.complete !== false && r.moreRbspData()) {
    transform8x8Mode = r.readFlag();
    picScalingMatrixPresent = r.readFlag();
    if (picScalingMatrixPresent) {
      const chromaFormatIdc = options.chromaFormatIdc ?? 1;
      const lists = 6 + (chromaFormatIdc !== 3 ? 2 : 6) * (transform8x8Mode ? 1 : 0);
      for (let i = 0; i < lists; i++) {
        if (r.readFlag()) skipScalingList(r, i < 6 ? 16 : 64);
      }
    }
    secondChromaQpIndexOffset = r.readSe();
  }

  return {
    picParameterSetId,
    seqParameterSetId,
    entropyCodingModeFlag,
    bottomFieldPicOrderInFramePresent,
    numSliceGroups,
    sliceGroupMapType,
    sliceGroupChangeRate,
    numRefIdxL0DefaultActive,
    numRefIdxL1DefaultActive,
    weightedPredFlag,
    weightedBipredIdc,
    picInitQp,
    picInitQs,
    chromaQpIndexOffset,
    deblockingFilterControlPresent,
    constrainedIntraPred,
    redundantPicCntPresent,
    transform8x8Mode,
    picScalingMatrixPresent,
    secondChromaQpIndexOffset,
  };
}
