// Sequence parameter set, ITU-T H.264 section 7.3.2.1.1 (semantics 7.4.2.1.1) with VUI (Annex E.1.1).
// Input: RBSP of the NAL unit (emulation prevention removed), header byte included.

import { RbspBitReader, RbspSyntaxError } from "./bit-reader";

export interface VuiParameters {
  aspectRatioIdc: number | null;
  /** Sample aspect ratio from Table E-1 or Extended_SAR; null when absent or unspecified. */
  sampleAspectRatio: { width: number; height: number } | null;
  videoFullRange: boolean | null;
  colourPrimaries: number | null;
  transferCharacteristics: number | null;
  matrixCoefficients: number | null;
  timingInfoPresent: boolean;
  numUnitsInTick: number | null;
  timeScale: number | null;
  fixedFrameRate: boolean | null;
  nalHrdPresent: boolean;
  vclHrdPresent: boolean;
  picStructPresent: boolean;
  maxNumReorderFrames: number | null;
  maxDecFrameBuffering: number | null;
}

export interface Sps {
  profileIdc: number;
  /** constraint_set0_flag .. constraint_set5_flag, index = set number. */
  constraintFlags: [boolean, boolean, boolean, boolean, boolean, boolean];
  levelIdc: number;
  seqParameterSetId: number;
  chromaFormatIdc: number;
  separateColourPlane: boolean;
  bitDepthLuma: number;
  bitDepthChroma: number;
  qpprimeYZeroTransformBypass: boolean;
  seqScalingMatrixPresent: boolean;
  log2MaxFrameNum: number;
  maxFrameNum: number;
  picOrderCntType: number;
  log2MaxPicOrderCntLsb: number | null;
  deltaPicOrderAlwaysZero: boolean;
  offsetForNonRefPic: number;
  offsetForTopToBottomField: number;
  offsetForRefFrame: number[];
  maxNumRefFrames: number;
  gapsInFrameNumAllowed: boolean;
  picWidthInMbs: number;
  picHeightInMapUnits: number;
  frameMbsOnly: boolean;
  mbAdaptiveFrameField: boolean;
  direct8x8Inference: boolean;
  frameCropping: { left: number; right: number; top: number; bottom: number } | null;
  vui: VuiParameters | null;
  // Derived values (section 7.4.2.1.1).
  chromaArrayType: number;
  frameHeightInMbs: number;
  picSizeInMapUnits: number;
  /** Macroblocks in a frame (PicWidthInMbs * FrameHeightInMbs). */
  frameSizeInMbs: number;
  codedWidth: number;
  codedHeight: number;
  width: number;
  height: number;
  /** time_scale / (2 * num_units_in_tick) when VUI timing is present and sane, else null. */
  fps: number | null;
}

// profile_idc values whose SPS carries chroma_format_idc and the high-profile fields (7.3.2.1.1).
const HIGH_PROFILE_IDCS = new Set([100, 110, 122, 244, 44, 83, 86, 118, 128, 138, 139, 134, 135]);

// Table E-1, sample aspect ratio for aspect_ratio_idc 1..16 (recalled from memory; the integration
// test checks idc 1 and 2 against ffprobe's sample_aspect_ratio, the others are unchecked).
const SAR_TABLE: ReadonlyArray<readonly [number, number]> = [
  [0, 0],
  [1, 1],
  [12, 11],
  [10, 11],
  [16, 11],
  [40, 33],
  [24, 11],
  [20, 11],
  [32, 11],
  [80, 33],
  [18, 11],
  [15, 11],
  [64, 33],
  [160, 99],
  [4, 3],
  [3, 2],
  [2, 1],
];
const EXTENDED_SAR = 255;

function fail(message: string): never {
  throw new RbspSyntaxError(`SPS: ${message}`);
}

/** scaling_list() of 7.3.2.1.1.1: only the bits matter to us, the matrix values are not kept. */
export function skipScalingList(r: RbspBitReader, size: number): void {
  let lastScale = 8;
  let nextScale = 8;
  for (let j = 0; j < size; j++) {
    if (nextScale !== 0) {
      const delta = r.readSe();
      if (delta < -128 || delta > 127) fail("delta_scale out of range");
      nextScale = (lastScale + delta + 256) % 256;
    }
    lastScale = nextScale === 0 ? lastScale : nextScale;
  }
}

function skipHrdParameters(r: RbspBitReader): void {
  const cpbCntMinus1 = r.readUe();
  if (cpbCntMinus1 > 31) fail("cpb_cnt_minus1 > 31");
  r.skipBits(4 + 4); // bit_rate_scale, cpb_size_scale
  for (let i = 0; i <= cpbCntMinus1; i++) {
    r.readUe(); // bit_rate_value_minus1
    r.readUe(); // cpb_size_value_minus1
    r.skipBits(1); // cbr_flag
  }
  r.skipBits(5 + 5 + 5 + 5); // initial_cpb_removal_delay_length_minus1 .. time_offset_length
}

function parseVui(r: RbspBitReader): VuiParameters {
  const vui: VuiParameters = {
    aspectRatioIdc: null,
    sampleAspectRatio: null,
    videoFullRange: null,
    colourPrimaries: null,
    transferCharacteristics: null,
    matrixCoefficients: null,
    timingInfoPresent: false,
    numUnitsInTick: null,
    timeScale: null,
    fixedFrameRate: null,
    nalHrdPresent: false,
    vclHrdPresent: false,
    picStructPresent: false,
    maxNumReorderFrames: null,
    maxDecFrameBuffering: null,
  };
  if (r.readFlag()) {
    const idc = r.readBits(8);
    vui.aspectRatioIdc = idc;
    if (idc === EXTENDED_SAR) {
      const width = r.readBits(16);
      const height = r.readBits(16);
      vui.sampleAspectRatio = width > 0 && height > 0 ? { width, height } : null;
    } else if (idc >= 1 && idc < SAR_TABLE.length) {
      const [width, height] = SAR_TABLE[idc];
      vui.sampleAspectRatio = { width, height };
    }
  }
  if (r.readFlag()) r.skipBits(1); // overscan_info_present_flag -> overscan_appropriate_flag
  if (r.readFlag()) {
    r.skipBits(3); // video_format
    vui.videoFullRange = r.readFlag();
    if (r.readFlag()) {
      vui.colourPrimaries = r.readBits(8);
      vui.transferCharacteristics = r.readBits(8);
      vui.matrixCoefficients = r.readBits(8);
    }
  }
  if (r.readFlag()) {
    r.readUe(); // chroma_sample_loc_type_top_field
    r.readUe(); // chroma_sample_loc_type_bottom_field
  }
  vui.timingInfoPresent = r.readFlag();
  if (vui.timingInfoPresent) {
    vui.numUnitsInTick = r.readBits(32);
    vui.timeScale = r.readBits(32);
    vui.fixedFrameRate = r.readFlag();
  }
  vui.nalHrdPresent = r.readFlag();
  if (vui.nalHrdPresent) skipHrdParameters(r);
  vui.vclHrdPresent = r.readFlag();
  if (vui.vclHrdPresent) skipHrdParameters(r);
  if (vui.nalHrdPresent || vui.vclHrdPresent) r.skipBits(1); // low_delay_hrd_flag
  vui.picStructPresent = r.readFlag();
  if (r.readFlag()) {
    r.skipBits(1); // motion_vectors_over_pic_boundaries_flag
    r.readUe(); // max_bytes_per_pic_denom
    r.readUe(); // max_bits_per_mb_denom
    r.readUe(); // log2_max_mv_length_horizontal
    r.readUe(); // log2_max_mv_length_vertical
    vui.maxNumReorderFrames = r.readUe();
    vui.maxDecFrameBuffering = r.readUe();
  }
  return vui;
}

/** SubWidthC / SubHeightC of Table 6-1, indexed by chroma_format_idc. */
const SUB_WIDTH_C = [1, 2, 2, 1];
const SUB_HEIGHT_C = [1, 2, 1, 1];

// Largest picture any level of Table A-1 allows is 139264 macroblocks (level 6.2); a bigger value
// only comes from corrupt bits.
const MAX_FRAME_SIZE_IN_MBS = 139264;

export function parseSps(rbsp: Uint8Array): Sps {
  const r = new RbspBitReader(rbsp);
  r.skipBits(8); // NAL header
  const profileIdc = r.readBits(8);
  const flagBits = r.readBits(8);
  const constraintFlags: Sps["constraintFlags"] = [
    (flagBits & 0x80) !== 0,
    (flagBits & 0x40) !== 0,
    (flagBits & 0x20) !== 0,
    (flagBits & 0x10) !== 0,
    (flagBits & 0x08) !== 0,
    (flagBits & 0x04) !== 0,
  ];
  const levelIdc = r.readBits(8);
  const seqParameterSetId = r.readUe();
  if (seqParameterSetId > 31) fail("seq_parameter_set_id > 31");

  let chromaFormatIdc = 1;
  let separateColourPlane = false;
  let bitDepthLuma = 8;
  let bitDepthChroma = 8;
  let qpprimeYZeroTransformBypass = false;
  let seqScalingMatrixPresent = false;
  if (HIGH_PROFILE_IDCS.has(profileIdc)) {
    chromaFormatIdc = r.readUe();
    if (chromaFormatIdc > 3) fail("chroma_format_idc > 3");
    if (chromaFormatIdc === 3) separateColourPlane = r.readFlag();
    const bitDepthLumaMinus8 = r.readUe();
    const bitDepthChromaMinus8 = r.readUe();
    if (bitDepthLumaMinus8 > 6 || bitDepthChromaMinus8 > 6) fail("bit depth > 14");
    bitDepthLuma = 8 + bitDepthLumaMinus8;
    bitDepthChroma = 8 + bitDepthChromaMinus8;
    qpprimeYZeroTransformBypass = r.readFlag();
    seqScalingMatrixPresent = r.readFlag();
    if (seqScalingMatrixPresent) {
      const lists = chromaFormatIdc !== 3 ? 8 : 12;
      for (let i = 0; i < lists; i++) {
        if (r.readFlag()) skipScalingList(r, i < 6 ? 16 : 64);
      }
    }
  }

  const log2MaxFrameNumMinus4 = r.readUe();
  if (log2MaxFrameNumMinus4 > 12) fail("log2_max_frame_num_minus4 > 12");
  const log2MaxFrameNum = log2MaxFrameNumMinus4 + 4;
  const picOrderCntType = r.readUe();
  if (picOrderCntType > 2) fail("pic_order_cnt_type > 2");
  let log2MaxPicOrderCntLsb: number | null = null;
  let deltaPicOrderAlwaysZero = false;
  let offsetForNonRefPic = 0;
  let offsetForTopToBottomField = 0;
  const offsetForRefFrame: number[] = [];
  if (picOrderCntType === 0) {
    const minus4 = r.readUe();
    if (minus4 > 12) fail("log2_max_pic_order_cnt_lsb_minus4 > 12");
    log2MaxPicOrderCntLsb = minus4 + 4;
  } else if (picOrderCntType === 1) {
    deltaPicOrderAlwaysZero = r.readFlag();
    offsetForNonRefPic = r.readSe();
    offsetForTopToBottomField = r.readSe();
    const cycle = r.readUe();
    if (cycle > 255) fail("num_ref_frames_in_pic_order_cnt_cycle > 255");
    for (let i = 0; i < cycle; i++) offsetForRefFrame.push(r.readSe());
  }
  const maxNumRefFrames = r.readUe();
  if (maxNumRefFrames > 16) fail("max_num_ref_frames > 16");
  const gapsInFrameNumAllowed = r.readFlag();
  const picWidthInMbs = r.readUe() + 1;
  const picHeightInMapUnits = r.readUe() + 1;
  const frameMbsOnly = r.readFlag();
  const mbAdaptiveFrameField = frameMbsOnly ? false : r.readFlag();
  const direct8x8Inference = r.readFlag();
  let frameCropping: Sps["frameCropping"] = null;
  if (r.readFlag()) {
    frameCropping = { left: r.readUe(), right: r.readUe(), top: r.readUe(), bottom: r.readUe() };
  }
  const vui = r.readFlag() ? parseVui(r) : null;

  const chromaArrayType = separateColourPlane ? 0 : chromaFormatIdc;
  const frameHeightInMbs = (2 - (frameMbsOnly ? 1 : 0)) * picHeightInMapUnits;
  const frameSizeInMbs = picWidthInMbs * frameHeightInMbs;
  if (frameSizeInMbs > MAX_FRAME_SIZE_IN_MBS) fail("picture larger than any level allows");
  const codedWidth = picWidthInMbs * 16;
  const codedHeight = frameHeightInMbs * 16;
  // Equations 7-19..7-22: crop offsets count in chroma sample units (and field rows when interlaced).
  const cropUnitX = chromaArrayType === 0 ? 1 : SUB_WIDTH_C[chromaFormatIdc];
  const cropUnitY =
    chromaArrayType === 0 ? 2 - (frameMbsOnly ? 1 : 0) : SUB_HEIGHT_C[chromaFormatIdc] * (2 - (frameMbsOnly ? 1 : 0));
  const crop = frameCropping ?? { left: 0, right: 0, top: 0, bottom: 0 };
  const width = codedWidth - cropUnitX * (crop.left + crop.right);
  const height = codedHeight - cropUnitY * (crop.top + crop.bottom);
  if (width <= 0 || height <= 0) fail("cropping removes the whole picture");

  let fps: number | null = null;
  if (vui?.timingInfoPresent && vui.numUnitsInTick && vui.timeScale) {
    fps = vui.timeScale / (2 * vui.numUnitsInTick);
  }

  return {
    profileIdc,
    constraintFlags,
    levelIdc,
    seqParameterSetId,
    chromaFormatIdc,
    separateColourPlane,
    bitDepthLuma,
    bitDepthChroma,
    qpprimeYZeroTransformBypass,
    seqScalingMatrixPresent,
    log2MaxFrameNum,
    maxFrameNum: 2 ** log2MaxFrameNum,
    picOrderCntType,
    log2MaxPicOrderCntLsb,
    deltaPicOrderAlwaysZero,
    offsetForNonRefPic,
    offsetForTopToBottomField,
    offsetForRefFrame,
    maxNumRefFrames,
    gapsInFrameNumAllowed,
    picWidthInMbs,
    picHeightInMapUnits,
    frameMbsOnly,
    mbAdaptiveFrameField,
    direct8x8Inference,
    frameCropping,
    vui,
    chromaArrayType,
    frameHeightInMbs,
    picSizeInMapUnits: picWidthInMbs * picHeightInMapUnits,
    frameSizeInMbs,
    codedWidth,
    codedHeight,
    width,
    height,
    fps,
  };
}
