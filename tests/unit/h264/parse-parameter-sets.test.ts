import { describe, expect, it } from "vitest";
import { describeLevel, describeProfile } from "@/lib/h264/describe-profile";
import { parsePps } from "@/lib/h264/parse-pps";
import { parseSliceHeader } from "@/lib/h264/parse-slice-header";
import { parseSps } from "@/lib/h264/parse-sps";
import { removeEmulationPrevention } from "@/lib/h264/remove-emulation-prevention";

// NAL units written by libx264 through Debian ffmpeg 5.1. The expected values are what ffmpeg's
// trace_headers bitstream filter printed for the same bytes (`ffmpeg -i x.264 -c copy -bsf:v
// trace_headers -f null -`), an independent parser of the same syntax.
const rbsp = (hex: string) => removeEmulationPrevention(Uint8Array.from(Buffer.from(hex, "hex")));

const SPS_432x240 = "6742c015d901b1fb0110000003001000000303c0f162e480";
const PPS_432x240 = "68cb8cb2";
const SPS_1920x1080 = "6742c028da01e0089f970110000003001000000303c0f1832a";
const SPS_422_320x180 = "677a000cbcd941419f8dc044000003000400000300c83c50a658";

describe("parseSps against ffmpeg trace_headers", () => {
  it("432x240 Constrained Baseline 2.1", () => {
    const sps = parseSps(rbsp(SPS_432x240));
    expect(sps).toMatchObject({
      profileIdc: 66,
      constraintFlags: [true, true, false, false, false, false],
      levelIdc: 21,
      seqParameterSetId: 0,
      log2MaxFrameNum: 4, // log2_max_frame_num_minus4 = 0
      picOrderCntType: 2,
      maxNumRefFrames: 3,
      gapsInFrameNumAllowed: false,
      picWidthInMbs: 27, // pic_width_in_mbs_minus1 = 26
      picHeightInMapUnits: 15, // pic_height_in_map_units_minus1 = 14
      frameMbsOnly: true,
      direct8x8Inference: true,
      frameCropping: null,
      width: 432,
      height: 240,
    });
    expect(sps.vui).toMatchObject({
      aspectRatioIdc: 1,
      numUnitsInTick: 1,
      timeScale: 60,
      fixedFrameRate: false,
      maxNumReorderFrames: 0,
      maxDecFrameBuffering: 3,
    });
    expect(sps.fps).toBe(30); // 60 / (2 * 1)
    expect(describeProfile(sps)).toBe("Constrained Baseline"); // ffprobe: profile=Constrained Baseline
    expect(describeLevel(sps)).toBe("2.1"); // ffprobe: level=21
  });

  it("1920x1080 crops 8 rows off 1088 (frame_crop_bottom_offset 4, CropUnitY 2)", () => {
    const sps = parseSps(rbsp(SPS_1920x1080));
    expect(sps).toMatchObject({
      levelIdc: 40,
      maxNumRefFrames: 1,
      picWidthInMbs: 120,
      picHeightInMapUnits: 68,
      frameCropping: { left: 0, right: 0, top: 0, bottom: 4 },
      codedWidth: 1920,
      codedHeight: 1088,
      width: 1920,
      height: 1080,
    });
    expect(sps.vui?.timeScale).toBe(60);
    expect(describeLevel(sps)).toBe("4");
  });

  it("High 4:2:2: chroma_format_idc 2 makes CropUnitY 1 (frame_crop_bottom_offset 12 -> 192 - 12 = 180)", () => {
    const sps = parseSps(rbsp(SPS_422_320x180));
    expect(sps).toMatchObject({
      profileIdc: 122,
      levelIdc: 12,
      chromaFormatIdc: 2,
      bitDepthLuma: 8,
      bitDepthChroma: 8,
      seqScalingMatrixPresent: false,
      picOrderCntType: 0,
      log2MaxPicOrderCntLsb: 6, // log2_max_pic_order_cnt_lsb_minus4 = 2
      maxNumRefFrames: 4,
      picWidthInMbs: 20,
      picHeightInMapUnits: 12,
      frameCropping: { left: 0, right: 0, top: 0, bottom: 12 },
      width: 320,
      height: 180, // ffprobe: 320x180
    });
    expect(sps.vui).toMatchObject({ timeScale: 50, numUnitsInTick: 1, maxNumReorderFrames: 2, maxDecFrameBuffering: 4 });
    expect(sps.fps).toBe(25);
    expect(describeProfile(sps)).toBe("High 4:2:2");
    expect(describeLevel(sps)).toBe("1.2");
  });

  it("has no frame rate when the SPS carries no VUI", () => {
    // The 432x240 SPS cut after frame_cropping_flag (bit 61 per trace_headers), then
    // vui_parameters_present_flag = 0 and rbsp_trailing_bits: every field before is unchanged.
    const original = rbsp(SPS_432x240);
    const bitAt = (i: number) => (original[i >> 3] >> (7 - (i & 7))) & 1;
    const bitString = Array.from({ length: 62 }, (_, i) => bitAt(i)).join("") + "0" + "1";
    const bytes = new Uint8Array(Math.ceil(bitString.length / 8));
    for (let i = 0; i < bitString.length; i++) if (bitString[i] === "1") bytes[i >> 3] |= 0x80 >> (i & 7);
    const sps = parseSps(bytes);
    expect(sps).toMatchObject({ width: 432, height: 240, maxNumRefFrames: 3, vui: null, fps: null });
  });

  it("rejects an SPS whose bits run out", () => {
    expect(() => parseSps(rbsp(SPS_432x240.slice(0, 14)))).toThrow();
  });
});

describe("parsePps and parseSliceHeader against ffmpeg trace_headers", () => {
  const sps = parseSps(rbsp(SPS_432x240));
  const pps = parsePps(rbsp(PPS_432x240));
  const sets = { sps: new Map([[0, sps]]), pps: new Map([[0, pps]]) };

  it("reads the PPS", () => {
    expect(pps).toMatchObject({
      picParameterSetId: 0,
      seqParameterSetId: 0,
      entropyCodingModeFlag: false,
      bottomFieldPicOrderInFramePresent: false,
      numSliceGroups: 1,
      numRefIdxL0DefaultActive: 3, // num_ref_idx_l0_default_active_minus1 = 2
      numRefIdxL1DefaultActive: 1,
      weightedPredFlag: false,
      weightedBipredIdc: 0,
      picInitQp: 26,
      picInitQs: 26,
      chromaQpIndexOffset: -2,
      deblockingFilterControlPresent: true,
      constrainedIntraPred: false,
      redundantPicCntPresent: false,
    });
  });

  it("reads an IDR slice header", () => {
    const result = parseSliceHeader(rbsp("6588845f1088ab830217e0214c88000401eb5061"), sets);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.header).toMatchObject({
      nalUnitType: 5,
      nalRefIdc: 3,
      idrPicFlag: true,
      firstMbInSlice: 0,
      sliceType: 7,
      picParameterSetId: 0,
      frameNum: 0,
      idrPicId: 0,
      noOutputOfPriorPics: false,
      longTermReference: false,
      sliceQpDelta: 1,
      disableDeblockingFilterIdc: 0,
      picSizeInMbs: 405,
    });
  });

  it("reads P slice headers with num_ref_idx override", () => {
    const first = parseSliceHeader(rbsp("419a38bf8562ea4feee1000170e7bc20098c4000"), sets);
    const second = parseSliceHeader(rbsp("419a542ff0dd64f091aa854a0262520f362d6c7c"), sets);
    expect(first.ok && second.ok).toBe(true);
    if (!first.ok || !second.ok) return;
    expect(first.header).toMatchObject({ nalRefIdc: 2, sliceType: 5, frameNum: 1, numRefIdxL0Active: 1, sliceQpDelta: 1 });
    expect(second.header).toMatchObject({ nalRefIdc: 2, sliceType: 5, frameNum: 2, numRefIdxL0Active: 2, sliceQpDelta: 1 });
  });

  it("fails on a slice that refers to an unknown PPS, keeping the fields read so far", () => {
    // ue(v) "00110" = 5 for pic_parameter_set_id
    const bytes = Uint8Array.from([0x41, 0b1_1_00110_0, 0b0010_0000, 0x80]);
    const result = parseSliceHeader(bytes, sets);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.partial).toMatchObject({ firstMbInSlice: 0, sliceType: 0, picParameterSetId: 5 });
  });

  it("fails on an IDR slice whose slice_type is P (7.4.3)", () => {
    const bytes = Uint8Array.from([0x65, 0b1_1_1_0000_1, 0x80, 0x00]);
    expect(parseSliceHeader(bytes, sets).ok).toBe(false);
  });
});

describe("describeProfile / describeLevel (ITU-T H.264 Annex A)", () => {
  const f = (profileIdc: number, flags: number, levelIdc = 30) => ({
    profileIdc,
    levelIdc,
    constraintFlags: [0, 1, 2, 3, 4, 5].map((i) => ((flags >> i) & 1) === 1) as [boolean, boolean, boolean, boolean, boolean, boolean],
  });
  it.each([
    [66, 0b000000, "Baseline"],
    [66, 0b000010, "Constrained Baseline"], // A.2.1.1: constraint_set1_flag
    [77, 0, "Main"],
    [88, 0, "Extended"],
    [100, 0, "High"],
    [100, 0b010000, "Progressive High"], // A.2.4.1: constraint_set4_flag
    [100, 0b110000, "Constrained High"], // A.2.4.2: constraint_set4_flag and constraint_set5_flag
    [110, 0, "High 10"],
    [110, 0b001000, "High 10 Intra"], // A.2.8: constraint_set3_flag
    [122, 0, "High 4:2:2"],
    [244, 0, "High 4:4:4 Predictive"],
    [244, 0b001000, "High 4:4:4 Intra"],
    [44, 0, "CAVLC 4:4:4 Intra"],
  ] as Array<[number, number, string]>)("profile_idc %i flags %i -> %s", (idc, flags, name) => {
    expect(describeProfile(f(idc, flags))).toBe(name);
  });

  it.each([
    [66, 0, 10, "1"],
    [66, 0b001000, 11, "1b"], // A.3.1: level_idc 11 with constraint_set3_flag in Baseline/Main/Extended
    [100, 0b001000, 11, "1.1"], // not in High profiles (they use level_idc 9 for 1b)
    [100, 0, 9, "1b"],
    [77, 0, 21, "2.1"],
    [100, 0, 40, "4"],
    [100, 0, 51, "5.1"],
  ] as Array<[number, number, number, string]>)("profile %i flags %i level_idc %i -> %s", (idc, flags, level, name) => {
    expect(describeLevel(f(idc, flags, level))).toBe(name);
  });
});
