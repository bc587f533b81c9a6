// One streaming pass over a raw H.264 Annex B stream: technical facts (profile, level, size, frame
// rate, frame count, IDR positions) and the signal trace, without decoding any slice data.
// Pictures are delimited as ITU-T H.264 sections 7.4.1.2.3 (access unit order) and 7.4.1.2.4
// (first VCL NAL unit of a new primary coded picture) describe.

import "server-only";
import { createReadStream } from "node:fs";
import { AnnexBSplitter, type NalUnit } from "./annexb-scanner";
import { describeLevel, describeProfile } from "./describe-profile";
import { isFirstSliceOfNewPicture } from "./detect-new-picture";
import { carriesSliceHeader, isReservedNalType, NalType, startsNewAccessUnit } from "./nal-unit-types";
import { parsePps, type Pps } from "./parse-pps";
import { parseSeiRecoveryPoint } from "./parse-sei-recovery-point";
import { parseSliceHeader, type SliceHeader } from "./parse-slice-header";
import { parseSps, type Sps } from "./parse-sps";
import { removeEmulationPrevention } from "./remove-emulation-prevention";
import { SignalTraceRecorder, type SignalTrace, type SignalTraceRecorderOptions } from "./signal-trace";

export interface StreamFacts {
  /** Annex A profile name, e.g. "Constrained Baseline"; null when no usable SPS was found. */
  profile: string | null;
  profileIdc: number | null;
  /** Level as Table A-1 writes it, e.g. "2.1" or "1b". */
  level: string | null;
  levelIdc: number | null;
  /** Display size after SPS cropping. */
  width: number | null;
  height: number | null;
  codedWidth: number | null;
  codedHeight: number | null;
  chromaFormatIdc: number | null;
  bitDepthLuma: number | null;
  sampleAspectRatio: { width: number; height: number } | null;
  interlaced: boolean | null;
  entropyCoding: "CAVLC" | "CABAC" | null;
  /** From VUI timing: time_scale / (2 * num_units_in_tick); null when the stream does not say. */
  fps: number | null;
  /** Coded frames in the file (a field pair counts once). */
  frameCount: number;
  idrCount: number;
  /** Whether the first coded picture is an IDR picture. */
  startsWithIdr: boolean;
  /** Byte offset of the first IDR access unit (its first NAL unit's start code: SPS/PPS included). */
  firstIdrOffset: number | null;
  sliceCount: number;
  nalUnitCount: number;
  byteLength: number;
  /** Slices whose header could not be read or held impossible values. */
  sliceHeaderErrors: number;
  /** Slices referring to a PPS/SPS not seen before them (a file cut before its parameter sets). */
  slicesWithoutParameterSets: number;
  /** NAL units with forbidden_zero_bit set or a reserved type: bytes damaged in transit. */
  corruptNalUnits: number;
  parameterSetErrors: number;
  /** Distinct SPS contents seen (more than 1 means the stream changed its parameters). */
  distinctSpsCount: number;
  /** Picture size of every change of the active SPS's size, from present frame `fromFrame` (file order). */
  pictureSizes: Array<{ width: number; height: number; fromFrame: number }>;
}

export interface ProbeResult {
  facts: StreamFacts;
  trace: SignalTrace;
}

export interface ProbeOptions extends SignalTraceRecorderOptions {
  /** Bytes kept from the front of each NAL unit; slice headers, SPS and PPS fit well within 512. */
  prefixBytes?: number;
}

interface PictureInProgress {
  offset: number;
  isIdr: boolean;
  isReference: boolean;
  header: SliceHeader | null;
  lastHeader: SliceHeader | null;
  /** first_mb_in_slice of the last slice whose header failed, to tell later slices apart. */
  lastPartialFirstMb: number | null;
  /** A slice starting at macroblock 0 was seen, readable or not. */
  hasTopSlice: boolean;
  partialFrameNum: number | null;
  damaged: boolean;
  hasMmco5: boolean;
  mbStarts: number[];
  recoveryFrameCnt: number | null;
  sps: Sps | null;
  usesSliceGroups: boolean;
}

interface FlushedPicture {
  isField: boolean;
  bottom: boolean;
  frameNum: number | null;
  isIdr: boolean;
  paired: boolean;
}

// Pictures with an identical multi-slice layout this many times in a row make the layout "fixed";
// a later picture whose slice starts are a strict subset of it is missing slices.
const STABLE_LAYOUT_PICTURES = 3;
const COLOUR_PLANE_STRIDE = 1 << 20;

class StreamAnalyzer {
  private readonly spsById = new Map<number, Sps>();
  private readonly ppsById = new Map<number, Pps>();
  private readonly spsSeen = new Set<string>();
  private readonly recorder: SignalTraceRecorder;
  private cur: PictureInProgress | null = null;
  private lastFlushed: FlushedPicture | null = null;
  private activeSps: Sps | null = null;
  private activePps: Pps | null = null;
  // Offset of the first NAL unit after the last VCL NAL unit: where the next access unit starts.
  private auCandidateStart: number | null = null;
  private boundaryPending = false;
  private pendingRecovery: number | null = null;
  private pendingDamage = false;
  private lastWasVcl = false;
  private stableLayout: number[] | null = null;
  private stableLayoutCount = 0;

  readonly facts: StreamFacts = {
    profile: null,
    profileIdc: null,
    level: null,
    levelIdc: null,
    width: null,
    height: null,
    codedWidth: null,
    codedHeight: null,
    chromaFormatIdc: null,
    bitDepthLuma: null,
    sampleAspectRatio: null,
    interlaced: null,
    entropyCoding: null,
    fps: null,
    frameCount: 0,
    idrCount: 0,
    startsWithIdr: false,
    firstIdrOffset: null,
    sliceCount: 0,
    nalUnitCount: 0,
    byteLength: 0,
    sliceHeaderErrors: 0,
    slicesWithoutParameterSets: 0,
    corruptNalUnits: 0,
    parameterSetErrors: 0,
    distinctSpsCount: 0,
    pictureSizes: [],
  };

  constructor(options: SignalTraceRecorderOptions) {
    this.recorder = new SignalTraceRecorder(options);
  }

  readonly onNal = (nal: NalUnit): void => {
    this.facts.nalUnitCount++;
    if (this.auCandidateStart === null) this.auCandidateStart = nal.startCodeOffset;
    const type = nal.nalUnitType;
    if (nal.forbiddenZeroBit !== 0 || isReservedNalType(type)) {
      this.onCorruptNal();
      return;
    }
    if (carriesSliceHeader(type)) {
      this.onSlice(nal);
      return;
    }
    if (this.lastWasVcl && startsNewAccessUnit(type)) this.boundaryPending = true;
    this.lastWasVcl = false;
    if (type === NalType.Sps) this.onSps(nal);
    else if (type === NalType.Pps) this.onPps(nal);
    else if (type === NalType.Sei) {
      const recovery = parseSeiRecoveryPoint(removeEmulationPrevention(nal.prefix));
      if (recovery) this.pendingRecovery = recovery.recoveryFrameCnt;
    } else if (type === NalType.EndOfSequence || type === NalType.EndOfStream) {
      // These close an access unit: whatever follows belongs to the next one.
      this.boundaryPending = true;
      this.auCandidateStart = null;
    }
  };

  finish(byteLength: number): ProbeResult {
    this.flushPicture();
    this.facts.byteLength = byteLength;
    this.facts.distinctSpsCount = this.spsSeen.size;
    applyActiveParameterSets(this.facts, this.activeSps, this.activePps);
    return { facts: this.facts, trace: this.recorder.finish() };
  }

  private onCorruptNal(): void {
    this.facts.corruptNalUnits++;
    // Usually a start code emulated by corrupted slice bytes: the slice before it was cut short.
    if (this.cur && this.lastWasVcl && !this.boundaryPending) this.cur.damaged = true;
    else this.pendingDamage = true;
  }

  private onSps(nal: NalUnit): void {
    try {
      const rbsp = removeEmulationPrevention(nal.prefix);
      const sps = parseSps(rbsp);
      this.spsById.set(sps.seqParameterSetId, sps);
      this.spsSeen.add(Buffer.from(rbsp).toString("base64"));
    } catch {
      this.facts.parameterSetErrors++;
    }
  }

  private onPps(nal: NalUnit): void {
    try {
      const rbsp = removeEmulationPrevention(nal.prefix);
      // The SPS id is the second field; peek at it so the optional tail is sized for its chroma format.
      const head = parsePps(rbsp, { complete: false });
      const sps = this.spsById.get(head.seqParameterSetId);
      const pps = parsePps(rbsp, { chromaFormatIdc: sps?.chromaFormatIdc ?? 1, complete: nal.size <= nal.prefix.length });
      this.ppsById.set(pps.picParameterSetId, pps);
    } catch {
      this.facts.parameterSetErrors++;
    }
  }

  private onSlice(nal: NalUnit): void {
    this.facts.sliceCount++;
    const result = parseSliceHeader(removeEmulationPrevention(nal.prefix), { sps: this.spsById, pps: this.ppsById });
    const isIdrNal = nal.nalUnitType === NalType.SliceIdr;
    const isRef = nal.nalRefIdc !== 0;
    if (result.ok) {
      const h = result.header;
      if (h.redundantPicCnt > 0) {
        // Redundant coded pictures repeat a primary picture; a decoder uses them only as spares.
        this.lastWasVcl = true;
        this.auCandidateStart = null;
        return;
      }
      if (this.startsNewPicture(h)) this.beginPicture(nal);
      const cur = this.cur!;
      if (!cur.header) {
        cur.header = h;
        cur.sps = this.spsById.get(h.seqParameterSetId) ?? null;
        cur.usesSliceGroups = (this.ppsById.get(h.picParameterSetId)?.numSliceGroups ?? 1) > 1;
        if (!this.activeSps) {
          this.activeSps = cur.sps;
          this.activePps = this.ppsById.get(h.picParameterSetId) ?? null;
        }
      }
      cur.lastHeader = h;
      cur.mbStarts.push((h.colourPlaneId ?? 0) * COLOUR_PLANE_STRIDE + h.firstMbAddress);
      if (h.firstMbAddress === 0) cur.hasTopSlice = true;
      if (h.hasMmco5) cur.hasMmco5 = true;
    } else {
      if (result.missingParameterSet) this.facts.slicesWithoutParameterSets++;
      else this.facts.sliceHeaderErrors++;
      const partial = result.partial;
      if (this.startsNewPictureFromPartial(partial.firstMbInSlice, partial.frameNum)) this.beginPicture(nal);
      const cur = this.cur!;
      cur.damaged = true;
      cur.lastPartialFirstMb = partial.firstMbInSlice ?? null;
      if (partial.firstMbInSlice === 0) cur.hasTopSlice = true;
      if (cur.partialFrameNum === null && partial.frameNum !== undefined) cur.partialFrameNum = partial.frameNum;
    }
    const cur = this.cur!;
    if (isIdrNal) cur.isIdr = true;
    if (isRef) cur.isReference = true;
    this.lastWasVcl = true;
    this.auCandidateStart = null;
  }

  private startsNewPicture(h: SliceHeader): boolean {
    const cur = this.cur;
    if (!cur || this.boundaryPending) return true;
    if (cur.lastHeader) {
      const sps = this.spsById.get(h.seqParameterSetId);
      if (isFirstSliceOfNewPicture(cur.lastHeader, h, sps?.picOrderCntType ?? 0)) return true;
      // Headers that match in every field 7.4.1.2.4 compares, yet the picture's first macroblock comes
      // again: a repeated picture, e.g. after losing exactly MaxFrameNum frames.
      const key = (h.colourPlaneId ?? 0) * COLOUR_PLANE_STRIDE + h.firstMbAddress;
      return h.firstMbAddress === 0 && cur.mbStarts.includes(key);
    }
    // Only unreadable slices so far: a slice restarting at the top begins a new picture.
    return h.firstMbAddress === 0 || (cur.lastPartialFirstMb !== null && h.firstMbAddress <= cur.lastPartialFirstMb);
  }

  private startsNewPictureFromPartial(firstMb: number | undefined, frameNum: number | undefined): boolean {
    const cur = this.cur;
    if (!cur || this.boundaryPending) return true;
    const curFrameNum = cur.header?.frameNum ?? cur.partialFrameNum;
    if (frameNum !== undefined && curFrameNum !== null && frameNum !== curFrameNum) return true;
    return firstMb === 0 && cur.hasTopSlice;
  }

  private beginPicture(nal: NalUnit): void {
    this.flushPicture();
    this.cur = {
      offset: this.auCandidateStart ?? nal.startCodeOffset,
      isIdr: false,
      isReference: false,
      header: null,
      lastHeader: null,
      lastPartialFirstMb: null,
      hasTopSlice: false,
      partialFrameNum: null,
      damaged: this.pendingDamage,
      hasMmco5: false,
      mbStarts: [],
      recoveryFrameCnt: this.pendingRecovery,
      sps: null,
      usesSliceGroups: false,
    };
    this.pendingDamage = false;
    this.pendingRecovery = null;
    this.boundaryPending = false;
  }

  private flushPicture(): void {
    const cur = this.cur;
    if (!cur) return;
    this.cur = null;
    const h = cur.header;
    const sps = cur.sps ?? this.activeSps;
    if (h && !cur.usesSliceGroups && this.isMissingSlices(cur)) cur.damaged = true;

    const isField = h?.fieldPicFlag ?? false;
    const bottom = h?.bottomFieldFlag ?? false;
    const frameNum = h ? h.frameNum : cur.partialFrameNum;
    const prev = this.lastFlushed;
    const secondField =
      prev !== null &&
      isField &&
      prev.isField &&
      !prev.paired &&
      prev.bottom !== bottom &&
      prev.frameNum === frameNum &&
      (!cur.isIdr || prev.isIdr);
    this.lastFlushed = { isField, bottom, frameNum, isIdr: cur.isIdr, paired: secondField };

    if (!secondField) {
      const facts = this.facts;
      if (cur.sps) {
        const last = facts.pictureSizes[facts.pictureSizes.length - 1];
        if (!last || last.width !== cur.sps.width || last.height !== cur.sps.height) {
          facts.pictureSizes.push({ width: cur.sps.width, height: cur.sps.height, fromFrame: facts.frameCount });
        }
      }
      if (facts.frameCount === 0) facts.startsWithIdr = cur.isIdr;
      facts.frameCount++;
      if (cur.isIdr) {
        facts.idrCount++;
        if (facts.firstIdrOffset === null) facts.firstIdrOffset = cur.offset;
      }
    }
    this.recorder.addPicture({
      offset: cur.offset,
      isIdr: cur.isIdr,
      isReference: cur.isReference,
      // A frame_num read from a header that failed later checks is not trusted for loss counting.
      frameNum: cur.isIdr ? 0 : h ? h.frameNum : null,
      maxFrameNum: sps?.maxFrameNum ?? 16,
      gapsInFrameNumAllowed: sps?.gapsInFrameNumAllowed ?? false,
      hasMmco5: cur.hasMmco5,
      recoveryFrameCnt: cur.recoveryFrameCnt,
      damaged: cur.damaged,
      secondField,
      idrPicId: h?.idrPicId ?? null,
      pocLsb: h && sps?.picOrderCntType === 0 ? h.picOrderCntLsb : null,
      maxPocLsb: sps?.picOrderCntType === 0 && sps.log2MaxPicOrderCntLsb !== null ? 1 << sps.log2MaxPicOrderCntLsb : null,
    });
  }

  /** Slice coverage that can be judged from slice starts alone (no FMO). */
  private isMissingSlices(cur: PictureInProgress): boolean {
    const starts = cur.mbStarts.slice().sort((a, b) => a - b);
    if (starts.length === 0) return false;
    // Every plane's first slice must start at macroblock 0 (ASO may send it later, hence the sort).
    if (starts[0] % COLOUR_PLANE_STRIDE !== 0) return true;
    for (let i = 1; i < starts.length; i++) if (starts[i] === starts[i - 1]) return true;
    const stable = this.stableLayout;
    if (stable && this.stableLayoutCount >= STABLE_LAYOUT_PICTURES && isStrictSubset(starts, stable)) return true;
    if (starts.length > 1 && stable && sameLayout(stable, starts)) {
      this.stableLayoutCount++;
    } else if (!cur.damaged) {
      this.stableLayout = starts;
      this.stableLayoutCount = 1;
    }
    return false;
  }
}

function isStrictSubset(small: number[], big: number[]): boolean {
  if (small.length >= big.length) return false;
  let j = 0;
  for (const s of small) {
    while (j < big.length && big[j] < s) j++;
    if (j === big.length || big[j] !== s) return false;
    j++;
  }
  return true;
}

function sameLayout(a: number[], b: number[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function applyActiveParameterSets(facts: StreamFacts, sps: Sps | null, pps: Pps | null): void {
  if (!sps) return;
  facts.profile = describeProfile(sps);
  facts.profileIdc = sps.profileIdc;
  facts.level = describeLevel(sps);
  facts.levelIdc = sps.levelIdc;
  facts.width = sps.width;
  facts.height = sps.height;
  facts.codedWidth = sps.codedWidth;
  facts.codedHeight = sps.codedHeight;
  facts.chromaFormatIdc = sps.chromaFormatIdc;
  facts.bitDepthLuma = sps.bitDepthLuma;
  facts.sampleAspectRatio = sps.vui?.sampleAspectRatio ?? null;
  facts.interlaced = !sps.frameMbsOnly;
  facts.fps = sps.fps;
  if (pps) facts.entropyCoding = pps.entropyCodingModeFlag ? "CABAC" : "CAVLC";
}

/** Probes a stream given as byte chunks (a Node Readable, or any async iterable of Uint8Array). */
export async function probeStream(source: AsyncIterable<Uint8Array>, options: ProbeOptions = {}): Promise<ProbeResult> {
  const splitter = new AnnexBSplitter({ prefixBytes: options.prefixBytes ?? 512 });
  const analyzer = new StreamAnalyzer(options);
  for await (const chunk of source) splitter.push(chunk, analyzer.onNal);
  splitter.end(analyzer.onNal);
  return analyzer.finish(splitter.stats.totalBytes);
}

/** Probes a file in 1 MiB reads; memory use does not grow with the file size (beyond the trace). */
export async function probeH264File(path: string, options: ProbeOptions = {}): Promise<ProbeResult> {
  return probeStream(createReadStream(path, { highWaterMark: 1 << 20 }), options);
}
