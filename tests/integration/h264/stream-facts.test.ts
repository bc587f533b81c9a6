import { createReadStream } from "node:fs";
import { describe, expect, it } from "vitest";
import { scanAnnexB } from "@/lib/h264/annexb-scanner";
import { NalType } from "@/lib/h264/nal-unit-types";
import { parsePps, type Pps } from "@/lib/h264/parse-pps";
import { parseSliceHeader, type SliceHeader } from "@/lib/h264/parse-slice-header";
import { parseSps, type Sps } from "@/lib/h264/parse-sps";
import { probeH264File } from "@/lib/h264/probe-stream";
import { removeEmulationPrevention } from "@/lib/h264/remove-emulation-prevention";
import { FrameFlag, FrameState } from "@/lib/h264/signal-trace";
import { makeRawH264, type MakeH264Options } from "@/tests/support/media/make-h264";
import { ffprobeFacts, readTraceHeaders, type TraceUnit } from "./ffmpeg-reference";

// Our SPS/PPS/slice header parser and stream facts against Debian ffmpeg 5.1: ffprobe (size, profile,
// level, frame rate, sample aspect ratio, decoded frame count, packet = access unit positions) and the
// trace_headers bitstream filter (every syntax element of every SPS and slice header).

interface Case {
  name: string;
  options: MakeH264Options;
}

const CASES: Case[] = [
  { name: "432x240 Constrained Baseline, controller-like", options: { width: 432, height: 240, seconds: 3 } },
  { name: "1920x1080 (1088 coded rows cropped to 1080)", options: { width: 1920, height: 1080, seconds: 1, bitrate: 2500, preset: "veryfast" } },
  { name: "640x360 Main, 25 fps, non-reference B-frames", options: { width: 640, height: 360, fps: 25, profile: "main", bframes: 2, x264Params: "b-pyramid=none" } },
  { name: "320x180 High with a B-pyramid (reference B-frames)", options: { width: 320, height: 180, profile: "high", bframes: 3, bitrate: 300 } },
  { name: "321x181 High 4:4:4 Predictive (CropUnitX 1)", options: { width: 321, height: 181, profile: "high444", seconds: 1 } },
  { name: "320x181 High 4:2:2 (CropUnitY 1)", options: { width: 320, height: 181, profile: "high422", seconds: 1 } },
  { name: "320x180 High 10", options: { width: 320, height: 180, profile: "high10", seconds: 1 } },
  { name: "640x360 interlaced MBAFF (CropUnitY 4)", options: { width: 640, height: 360, profile: "high", seconds: 1, x264Params: "interlaced=1" } },
  { name: "432x240 four slices per picture", options: { width: 432, height: 240, x264Params: "slices=4" } },
  { name: "320x180 SAR 12:11, 25 fps written as tick rate", options: { width: 320, height: 180, sar: "12/11", bsf: "h264_metadata=tick_rate=50" } },
];

/** Our own reading of every SPS and slice header in file order. */
async function readOurHeaders(file: string): Promise<{ sps: Sps[]; slices: SliceHeader[] }> {
  const spsById = new Map<number, Sps>();
  const ppsById = new Map<number, Pps>();
  const sps: Sps[] = [];
  const slices: SliceHeader[] = [];
  for await (const nal of scanAnnexB(createReadStream(file))) {
    const rbsp = removeEmulationPrevention(nal.prefix);
    if (nal.nalUnitType === NalType.Sps) {
      const s = parseSps(rbsp);
      spsById.set(s.seqParameterSetId, s);
      sps.push(s);
    } else if (nal.nalUnitType === NalType.Pps) {
      const p = parsePps(rbsp, { chromaFormatIdc: spsById.get(0)?.chromaFormatIdc });
      ppsById.set(p.picParameterSetId, p);
    } else if (nal.nalUnitType === NalType.SliceIdr || nal.nalUnitType === NalType.SliceNonIdr) {
      const result = parseSliceHeader(rbsp, { sps: spsById, pps: ppsById });
      if (!result.ok) throw new Error(`slice at ${nal.offset}: ${result.error}`);
      slices.push(result.header);
    }
  }
  return { sps, slices };
}

/** The trace_headers fields that our Sps exposes, mapped to our values. */
function spsAsTraceFields(s: Sps, reference: Record<string, number>): Record<string, number> {
  const ours: Record<string, number> = {
    profile_idc: s.profileIdc,
    constraint_set1_flag: Number(s.constraintFlags[1]),
    constraint_set3_flag: Number(s.constraintFlags[3]),
    level_idc: s.levelIdc,
    seq_parameter_set_id: s.seqParameterSetId,
    log2_max_frame_num_minus4: s.log2MaxFrameNum - 4,
    pic_order_cnt_type: s.picOrderCntType,
    max_num_ref_frames: s.maxNumRefFrames,
    gaps_in_frame_num_allowed_flag: Number(s.gapsInFrameNumAllowed),
    pic_width_in_mbs_minus1: s.picWidthInMbs - 1,
    pic_height_in_map_units_minus1: s.picHeightInMapUnits - 1,
    frame_mbs_only_flag: Number(s.frameMbsOnly),
    direct_8x8_inference_flag: Number(s.direct8x8Inference),
    frame_cropping_flag: Number(s.frameCropping !== null),
    vui_parameters_present_flag: Number(s.vui !== null),
  };
  if ("chroma_format_idc" in reference) {
    ours.chroma_format_idc = s.chromaFormatIdc;
    ours.bit_depth_luma_minus8 = s.bitDepthLuma - 8;
    ours.bit_depth_chroma_minus8 = s.bitDepthChroma - 8;
  }
  if ("log2_max_pic_order_cnt_lsb_minus4" in reference) ours.log2_max_pic_order_cnt_lsb_minus4 = (s.log2MaxPicOrderCntLsb ?? 0) - 4;
  if ("mb_adaptive_frame_field_flag" in reference) ours.mb_adaptive_frame_field_flag = Number(s.mbAdaptiveFrameField);
  if (s.frameCropping) {
    ours.frame_crop_left_offset = s.frameCropping.left;
    ours.frame_crop_right_offset = s.frameCropping.right;
    ours.frame_crop_top_offset = s.frameCropping.top;
    ours.frame_crop_bottom_offset = s.frameCropping.bottom;
  }
  if (s.vui?.aspectRatioIdc !== null && s.vui?.aspectRatioIdc !== undefined) ours.aspect_ratio_idc = s.vui.aspectRatioIdc;
  if (s.vui?.timingInfoPresent) {
    ours.num_units_in_tick = s.vui.numUnitsInTick!;
    ours.time_scale = s.vui.timeScale!;
    ours.fixed_frame_rate_flag = Number(s.vui.fixedFrameRate);
  }
  if (s.vui?.maxDecFrameBuffering !== null && s.vui?.maxDecFrameBuffering !== undefined) {
    ours.max_num_reorder_frames = s.vui.maxNumReorderFrames!;
    ours.max_dec_frame_buffering = s.vui.maxDecFrameBuffering;
  }
  return ours;
}

function sliceAsTraceFields(h: SliceHeader, reference: Record<string, number>): Record<string, number> {
  const ours: Record<string, number> = {
    nal_ref_idc: h.nalRefIdc,
    nal_unit_type: h.nalUnitType,
    first_mb_in_slice: h.firstMbInSlice,
    slice_type: h.sliceType,
    pic_parameter_set_id: h.picParameterSetId,
    frame_num: h.frameNum,
    slice_qp_delta: h.sliceQpDelta,
  };
  if ("field_pic_flag" in reference) ours.field_pic_flag = Number(h.fieldPicFlag);
  if ("idr_pic_id" in reference) ours.idr_pic_id = h.idrPicId!;
  if ("pic_order_cnt_lsb" in reference) ours.pic_order_cnt_lsb = h.picOrderCntLsb!;
  if ("delta_pic_order_cnt_bottom" in reference) ours.delta_pic_order_cnt_bottom = h.deltaPicOrderCntBottom;
  if ("direct_spatial_mv_pred_flag" in reference) ours.direct_spatial_mv_pred_flag = Number(h.directSpatialMvPred);
  if ("num_ref_idx_l0_active_minus1" in reference) ours.num_ref_idx_l0_active_minus1 = h.numRefIdxL0Active - 1;
  if ("num_ref_idx_l1_active_minus1" in reference) ours.num_ref_idx_l1_active_minus1 = h.numRefIdxL1Active - 1;
  if ("cabac_init_idc" in reference) ours.cabac_init_idc = h.cabacInitIdc!;
  if ("disable_deblocking_filter_idc" in reference) ours.disable_deblocking_filter_idc = h.disableDeblockingFilterIdc;
  return ours;
}

function pick(fields: Record<string, number>, keys: string[]): Record<string, number> {
  return Object.fromEntries(keys.map((k) => [k, fields[k]]));
}

describe.each(CASES)("$name", ({ options }) => {
  it("matches ffprobe and trace_headers", async () => {
    const file = await makeRawH264(options);
    const [{ facts, trace }, probe, units, ours] = await Promise.all([
      probeH264File(file),
      ffprobeFacts(file),
      readTraceHeaders(file),
      readOurHeaders(file),
    ]);

    // ffprobe: stream facts.
    expect({ width: facts.width, height: facts.height }).toEqual({ width: probe.width, height: probe.height });
    expect({ width: facts.width, height: facts.height }).toEqual({ width: options.width, height: options.height });
    expect(facts.profile).toBe(probe.profile);
    expect(facts.levelIdc).toBe(probe.level);
    expect(facts.fps).toBe(probe.rFrameRate);
    expect(`${facts.sampleAspectRatio?.width}:${facts.sampleAspectRatio?.height}`).toBe(probe.sampleAspectRatio);
    expect(facts.frameCount).toBe(probe.nbReadFrames);
    // ffprobe's packets are the access units its parser found: same count and same byte offsets.
    const ourOffsets = Array.from(trace.offsets).filter((_, i) => trace.flags[i] & FrameFlag.Present);
    expect(ourOffsets).toEqual(probe.packetPositions);

    // trace_headers: every SPS field we expose, every slice header field in order.
    const refSps = units.filter((u: TraceUnit) => u.title === "Sequence Parameter Set");
    expect(ours.sps.length).toBe(refSps.length);
    ours.sps.forEach((s, i) => {
      const mine = spsAsTraceFields(s, refSps[i].fields);
      expect(mine).toEqual(pick(refSps[i].fields, Object.keys(mine)));
    });
    const refSlices = units.filter((u) => u.title === "Slice Header");
    expect(ours.slices.length).toBe(refSlices.length);
    ours.slices.forEach((h, i) => {
      const mine = sliceAsTraceFields(h, refSlices[i].fields);
      expect(mine).toEqual(pick(refSlices[i].fields, Object.keys(mine)));
    });
    const refIdrPictures = refSlices.filter((u) => u.fields.nal_unit_type === 5 && u.fields.first_mb_in_slice === 0);
    expect(facts.idrCount).toBe(refIdrPictures.length);

    // A clean encode: every frame intact, the first one an IDR at offset 0.
    expect(facts.startsWithIdr).toBe(true);
    expect(facts.firstIdrOffset).toBe(0);
    expect(trace.lossEvents).toBe(0);
    expect(trace.states.every((s) => s === FrameState.Intact)).toBe(true);
    expect(facts.sliceHeaderErrors + facts.corruptNalUnits + facts.parameterSetErrors).toBe(0);
  });
});
