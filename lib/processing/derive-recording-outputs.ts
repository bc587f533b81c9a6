// Everything derived from one original, written into a work folder: the playable MP4, the poster, the
// thumbnail sprite and its WebVTT track, the technical facts and, for raw H.264 streams, the signal
// trace. No database and no queue here: the worker commits the result; the benchmark runs it bare.
// The original is only ever opened for reading.
import "server-only";
import { createReadStream } from "node:fs";
import { rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import type { ProbeFacts } from "@/db/schema/media";
import { probeStream, type ProbeResult, type StreamFacts } from "@/lib/h264/probe-stream";
import { FrameState, findFrameAtOffset, presentFrameSlots, type SignalTrace } from "@/lib/h264/signal-trace";
import { frameRateFromFps } from "@/lib/recordings/recording-frame-rate";
import { locateDecoderEvents } from "@/lib/h264/ffmpeg-decode-errors";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { readFileHead } from "@/lib/uploads/read-file-head";
import { buildTraceRecord, type TraceRecord } from "./build-trace-record";
import { chooseFrameRate } from "./choose-frame-rate";
import { chooseThumbnailPlan } from "./choose-thumbnail-plan";
import { detectMediaKind, type MediaKind } from "./detect-media-kind";
import { MediaToolError, readH264DecoderErrors, runFfmpeg } from "./ffmpeg";
import { makePoster, posterTimeSec, POSTER_FILE } from "./make-poster";
import { makeThumbnailTrack, SPRITE_FILE, THUMBNAILS_FILE } from "./make-thumbnail-track";
import { planContainerPlayable, planRawPlayable, type PlayablePlan } from "./plan-playable";
import { readContainerFacts, type ContainerFacts } from "./read-container-facts";
import { readJpegSize } from "./read-jpeg-size";
import { planTimedReencode } from "./plan-timed-reencode";
import { computeRecordingFigures, type RecordingFigures } from "../recordings/recording-figures";
import { RecordingRefused, refusalFromToolError } from "../recordings/recording-refused";

export const PLAYABLE_FILE = "playable.mp4";
const STAMPED_FILE = "stamped.nut";
const TIMESTAMPS_SCRIPT = "timestamps.filter";

export type RenditionKind = "playable" | "poster" | "sprite" | "thumbnails_vtt";

/** Facts kept on the recording: the shared ProbeFacts plus what this pipeline knows besides. */
export type RecordingFacts = ProbeFacts & {
  detectedKind: MediaKind;
  levelName?: string | null;
  codedWidth?: number | null;
  codedHeight?: number | null;
  entropyCoding?: string | null;
  chromaFormat?: string | null;
  bitDepth?: number | null;
  /** Frames in the original stream (raw H.264, counted by our parser). */
  streamFrameCount?: number;
  idrCount?: number;
  startsWithIdr?: boolean;
  /** Stream frame index where the playable starts (frames before the first IDR are left out). */
  playableFirstFrame?: number;
  playableMode?: PlayablePlan["mode"] | "reencode";
  playableNote?: string;
  audioCodec?: string | null;
  /** Why a signal trace is not computed for this recording, when it is not. */
  traceNotApplicable?: string;
};

export interface DerivedOutput {
  kind: RenditionKind;
  file: string;
  mimeType: string;
  sizeBytes: number;
  sha256: string;
  width: number | null;
  height: number | null;
  tool: string;
  toolArgs: string[];
}

export interface DeriveResult {
  facts: RecordingFacts;
  /** figures.durationSeconds when there are figures. */
  durationSec: number | null;
  /** The one set of figures (null for stills). */
  figures: RecordingFigures | null;
  outputs: DerivedOutput[];
  trace: TraceRecord | null;
}

export interface DeriveInput {
  declaredKind: MediaKind;
  originalPath: string;
  fpsOverride: number | null;
  organisationDefaultFps: number;
  workDir: string;
  signal: AbortSignal;
  /** Bytes the first look at a raw stream reads (default 4 MiB); tests make it small. */
  headBytes?: number;
  /** 0..100 over the whole derivation, with the step's name. */
  onProgress?: (percent: number, step: string) => void;
  /** Called once the playable MP4 is final (raw H.264), before the thumbnails: the benchmark times it. */
  onPlayable?: () => void;
}

const CHROMA = ["4:0:0", "4:2:0", "4:2:2", "4:4:4"];

type Progress = (percent: number, step: string) => void;
const span = (report: Progress, from: number, to: number, step: string) => (p: number) =>
  report(from + ((to - from) * Math.min(100, Math.max(0, p))) / 100, step);

export async function deriveRecordingOutputs(input: DeriveInput): Promise<DeriveResult> {
  const report: Progress = input.onProgress ?? (() => {});
  const size = (await stat(input.originalPath)).size;
  if (size === 0) throw new RecordingRefused("The file is empty (0 bytes)");
  const kind = detectMediaKind(await readFileHead(input.originalPath, 16), input.declaredKind);
  if (kind === "raw_h264") return deriveFromRawH264(input, size, report);
  if (kind === "jpeg") return deriveFromStill(input, report);
  return deriveFromContainer(input, kind, report);
}

/** Reads the original in 1 MiB chunks, reporting progress and stopping when the job is cancelled. */
async function* readWithProgress(file: string, size: number, signal: AbortSignal, onProgress: (p: number) => void, limitBytes?: number) {
  let done = 0;
  let lastReported = 0;
  const range = limitBytes !== undefined ? { start: 0, end: limitBytes - 1 } : {};
  for await (const chunk of createReadStream(file, { highWaterMark: 1 << 20, ...range })) {
    if (signal.aborted) throw signal.reason instanceof Error ? signal.reason : new Error("cancelled");
    done += (chunk as Buffer).length;
    const p = (done / size) * 100;
    if (p - lastReported >= 1) {
      lastReported = p;
      onProgress(p);
    }
    yield chunk as Buffer;
  }
}

/** ffmpeg failing on the original: a refusal when its message is about the content, else the error. */
function asRefusal(err: unknown): unknown {
  if (err instanceof MediaToolError && !err.aborted) return refusalFromToolError(`${err.message}\n${err.stderrTail}`) ?? err;
  return err;
}

// A controller stream's SPS, PPS and first IDR picture sit in its first seconds: 4 MiB holds them
// with room to spare at controller bitrates (~0.5 Mbit/s), and still covers a few seconds of 1080p.
const HEAD_BYTES = 4 << 20;

/** Overall progress from parts that run side by side, each 0..100, weighted. */
function progressParts<K extends string>(weights: Record<K, number>, report: Progress) {
  const done = Object.fromEntries(Object.keys(weights).map((k) => [k, 0])) as Record<K, number>;
  const total = Object.values<number>(weights).reduce((a, b) => a + b, 0);
  return (part: K, step: string) => (percent: number) => {
    done[part] = Math.max(done[part], Math.min(100, Math.max(0, percent)));
    let sum = 0;
    for (const k of Object.keys(weights) as K[]) sum += weights[k] * done[k];
    report(sum / total, step);
  };
}

function refuseUnusable(s: StreamFacts): asserts s is StreamFacts & { width: number; height: number } {
  if (s.width === null || s.height === null) {
    throw new RecordingRefused("No H.264 video found: the file holds no readable sequence parameter set (not an H.264 stream, or damaged before the first one)");
  }
  if (s.frameCount === 0 || s.sliceCount === 0) throw new RecordingRefused("No H.264 pictures found: the stream ends before its first frame");
}

async function deriveFromRawH264(input: DeriveInput, size: number, report: Progress): Promise<DeriveResult> {
  const local = new AbortController();
  const follow = () => local.abort(input.signal.reason);
  if (input.signal.aborted) follow();
  else input.signal.addEventListener("abort", follow, { once: true });
  try {
    return await deriveFromRawH264Linked({ ...input, signal: local.signal }, size, report);
  } catch (err) {
    // A step failed: stop what still runs alongside it (the whole-file scan, the decoder pass).
    local.abort(err);
    throw err;
  } finally {
    input.signal.removeEventListener("abort", follow);
  }
}

async function deriveFromRawH264Linked(input: DeriveInput, size: number, report: Progress): Promise<DeriveResult> {
  const { signal, workDir } = input;
  const part = progressParts({ scan: 15, playable: 12, decoder: 25, thumbnails: 33, seal: 8 }, report);
  report(0, "reading the stream");
  // The head decides how to make the playable (rate, first IDR, browser-ready or not), so the
  // whole-file scan for the signal trace runs alongside ffmpeg rather than before it.
  const headBytes = input.headBytes ?? HEAD_BYTES;
  const head = await probeStream(readWithProgress(input.originalPath, Math.min(size, headBytes), signal, () => {}, headBytes));
  let scanning: Promise<ProbeResult> | null = size <= headBytes ? Promise.resolve(head) : null;
  const scan = () =>
    (scanning ??= probeStream(readWithProgress(input.originalPath, size, signal, part("scan", "reading the stream"))));
  let shape = head.facts;
  const headDecides = shape.width !== null && (shape.startsWithIdr || shape.firstIdrOffset !== null);
  if (!headDecides) shape = (await scan()).facts;
  refuseUnusable(shape);

  const rate = chooseFrameRate({ override: input.fpsOverride, streamFps: shape.fps, organisationDefault: input.organisationDefaultFps });
  const plan = planRawPlayable(shape, rate.fps);
  const playablePath = path.join(workDir, PLAYABLE_FILE);
  const scanned = scan();
  const decoded = readH264DecoderErrors(input.originalPath, signal).then((r) => {
    part("decoder", "cross-checking with ffmpeg's decoder")(100);
    return r;
  });
  // Settled below; until then a failure of one must not surface as an unhandled rejection.
  scanned.catch(() => {});
  decoded.catch(() => {});

  let playableArgs: string[] = [];
  // Frames expected, for ffmpeg's progress: the head's bytes per frame over the whole file.
  const expectedFrames = head.facts.frameCount > 0 && head.facts.byteLength > 0 ? (head.facts.frameCount * size) / head.facts.byteLength : 0;
  const copy = async (): Promise<{ error: unknown } | null> => {
    // From the first IDR on, fed through stdin: no copy of a multi-gigabyte original.
    const cutStream = plan.startOffset > 0 ? createReadStream(input.originalPath, { start: plan.startOffset, highWaterMark: 1 << 20 }) : null;
    try {
      const run = await runFfmpeg({
        label: "playable",
        input: {
          source: cutStream ?? input.originalPath,
          name: plan.startOffset > 0 ? `original@${plan.startOffset}` : "original",
          options: plan.inputOptions,
        },
        output: { path: playablePath, name: PLAYABLE_FILE, options: plan.outputOptions },
        signal,
        expectedDurationSec: expectedFrames > 0 ? expectedFrames / rate.fps : undefined,
        onProgress: part("playable", "making the playable video"),
      });
      playableArgs = run.args;
      return null;
    } catch (err) {
      if (err instanceof MediaToolError && err.aborted) throw err;
      return { error: err };
    } finally {
      // ffmpeg may stop reading early (failure, cancel): the file must not stay open.
      cutStream?.destroy();
    }
  };
  // A head without damage: the copy starts alongside the whole-file scan (the common, clean case).
  const headClean = plan.startOffset === 0 && head.facts.startsWithIdr && head.trace.states.every((st) => st === FrameState.Intact);
  const copying = headClean ? copy() : null;
  copying?.catch(() => {});

  const probe = await scanned;
  const s = probe.facts;
  refuseUnusable(s);
  const frameRate = frameRateFromFps(rate.fps);
  // Damage seen by the stream scan (lost or damaged slots, frames before the first IDR, a change of
  // parameters) or by the decoder: the copy would carry it to the browser, so the playable is
  // decoded and re-encoded on the recorder's clock instead (plan-timed-reencode.ts).
  const scanFoundDamage = probe.trace.states.some((st) => st !== FrameState.Intact) || plan.startOffset > 0 || s.distinctSpsCount > 1;
  const made: { mode: NonNullable<RecordingFacts["playableMode"]>; note: string } = { mode: plan.mode, note: plan.reason };
  const reencode = async () => {
    const scriptPath = path.join(workDir, TIMESTAMPS_SCRIPT);
    const stampedPath = path.join(workDir, STAMPED_FILE);
    const timed = planTimedReencode(
      { presentSlots: presentFrameSlots(probe.trace), frameSlots: probe.trace.length, rate: frameRate, width: s.width, height: s.height },
      scriptPath,
    );
    try {
      await writeFile(scriptPath, timed.filterScript);
      const stamp = await runFfmpeg({
        label: "timestamps",
        input: { source: input.originalPath, name: "original", options: timed.stamp.inputOptions },
        output: { path: stampedPath, name: STAMPED_FILE, options: timed.stamp.outputOptions },
        signal,
      });
      const run = await runFfmpeg({
        label: "playable",
        input: { source: stampedPath, name: STAMPED_FILE, options: timed.inputOptions },
        output: { path: playablePath, name: PLAYABLE_FILE, options: timed.outputOptions },
        signal,
        expectedDurationSec: probe.trace.length / rate.fps,
        onProgress: part("playable", "re-encoding the damaged video"),
      });
      playableArgs = [...stamp.args, "&&", "ffmpeg", ...run.args, `(${TIMESTAMPS_SCRIPT}: ${timed.filterScript})`];
    } catch (err) {
      throw asRefusal(err);
    } finally {
      // work files, not outputs: the worker moves the whole folder into place
      await rm(stampedPath, { force: true });
      await rm(scriptPath, { force: true });
    }
    made.mode = "reencode";
    made.note = "decoded and re-encoded with libx264 because the stream is damaged; lost frames hold the frame before them, so times match the recorder's";
  };
  // The copy must be done with the file before a re-encode writes it.
  let copyFailed = copying ? (await copying) !== null : false;
  let located: ReturnType<typeof locateDecoderEvents>;
  if (scanFoundDamage) {
    // The decoder pass runs alongside the re-encode.
    await reencode();
    input.onPlayable?.();
    located = locateDecoderEvents(await decoded, probe.trace);
  } else {
    if (!copying) copyFailed = (await copy()) !== null;
    located = locateDecoderEvents(await decoded, probe.trace);
    // Damage only the decoder sees (inside slice data), or a copy ffmpeg could not finish.
    if (copyFailed || located.damagedFrames.length > 0 || located.gapFrames.length > 0) await reencode();
    input.onPlayable?.();
  }

  const playable = await readContainerFacts(playablePath, signal);
  const frameCount = playable.video?.frameCount ?? 0;
  if (!playable.video || frameCount === 0) throw new RecordingRefused("ffmpeg could not make a playable video from this stream: no frame survived");
  const trace = buildTraceRecord(probe.trace, rate.fps, located);
  const figures = computeRecordingFigures({
    frameRate,
    states: trace.states,
    framesLostIsLowerBound: probe.trace.lostIsLowerBound,
    rendition: made.mode === "reencode" ? "reencode" : made.mode === "transcode" ? "transcode" : "copy",
    pictureSizes: pictureSizesInSlots(s.pictureSizes, probe.trace),
  });
  const durationSec = figures.durationSeconds;

  const common = await deriveStillsAndThumbnails({
    playablePath,
    durationSec,
    width: playable.video.width,
    height: playable.video.height,
    sampleAspect: s.sampleAspectRatio ? s.sampleAspectRatio.width / s.sampleAspectRatio.height : 1,
    workDir,
    signal,
    report: (p, step) => part("thumbnails", step)(p),
    range: [0, 100],
  });

  const facts: RecordingFacts = {
    detectedKind: "raw_h264",
    codec: "h264",
    profile: s.profile ?? undefined,
    level: s.levelIdc,
    levelName: s.level,
    width: s.width,
    height: s.height,
    codedWidth: s.codedWidth,
    codedHeight: s.codedHeight,
    entropyCoding: s.entropyCoding,
    chromaFormat: s.chromaFormatIdc === null ? null : (CHROMA[s.chromaFormatIdc] ?? null),
    bitDepth: s.bitDepthLuma,
    frameCount: figures.frameSlots,
    durationSec,
    bitrate: Math.round((size * 8) / (s.frameCount / rate.fps)),
    fps: rate.fps,
    fpsSource: rate.source,
    streamFrameCount: s.frameCount,
    idrCount: s.idrCount,
    startsWithIdr: s.startsWithIdr,
    // The re-encoded playable starts at slot 0 (the first picture held until the first IDR).
    playableFirstFrame: made.mode === "reencode" ? 0 : framesBefore(probe.trace, plan.startOffset),
    playableMode: made.mode,
    playableNote: made.note,
  };
  const outputs = await hashOutputs(
    [
      { kind: "playable", file: PLAYABLE_FILE, mimeType: "video/mp4", width: playable.video.width, height: playable.video.height, tool: "ffmpeg", toolArgs: playableArgs },
      ...common,
    ],
    workDir,
    part("seal", "sealing the outputs"),
  );
  return { facts, durationSec, figures, outputs, trace };
}

/** Picture sizes per SPS change, from present-frame indexes to recorder slots. */
function pictureSizesInSlots(sizes: StreamFacts["pictureSizes"], trace: SignalTrace): RecordingFigures["pictureSizes"] {
  const slots = presentFrameSlots(trace);
  return sizes.map((z) => ({ width: z.width, height: z.height, fromSlot: slots[Math.min(z.fromFrame, slots.length - 1)] ?? 0 }));
}

/** Frames present in the stream before byte `offset` (where the playable starts). */
function framesBefore(trace: SignalTrace, offset: number): number {
  if (offset <= 0) return 0;
  return findFrameAtOffset(trace, presentFrameSlots(trace), offset - 1) + 1;
}

async function deriveFromContainer(input: DeriveInput, kind: MediaKind, report: Progress): Promise<DeriveResult> {
  const { signal, workDir } = input;
  report(0, "reading the container");
  let source: ContainerFacts;
  try {
    source = await readContainerFacts(input.originalPath, signal);
  } catch (err) {
    throw asRefusal(err);
  }
  if (!source.video) {
    throw new RecordingRefused(source.audio ? "No video track: the file holds only audio" : "No video track in the file");
  }
  const plan = planContainerPlayable({ videoCodec: source.video.codec, pixFmt: source.video.pixFmt, audioCodec: source.audio?.codec ?? null });
  const playablePath = path.join(workDir, PLAYABLE_FILE);
  let playableArgs: string[];
  try {
    const run = await runFfmpeg({
      label: "playable",
      input: { source: input.originalPath, name: "original", options: plan.inputOptions },
      output: { path: playablePath, name: PLAYABLE_FILE, options: plan.outputOptions },
      signal,
      expectedDurationSec: source.durationSec ?? source.video.durationSec ?? undefined,
      onProgress: span(report, 2, plan.mode === "remux" ? 30 : 70, "making the playable video"),
    });
    playableArgs = run.args;
  } catch (err) {
    throw asRefusal(err);
  }
  const playable = await readContainerFacts(playablePath, signal);
  if (!playable.video || !playable.video.frameCount) throw new RecordingRefused("ffmpeg could not make a playable video from this file: no frame survived");
  const durationSec = playable.video.durationSec ?? playable.durationSec ?? 0;
  if (!(durationSec > 0)) throw new RecordingRefused("The video has no duration: nothing to play");
  report(plan.mode === "remux" ? 30 : 70, "making thumbnails");
  const common = await deriveStillsAndThumbnails({
    playablePath,
    durationSec,
    width: playable.video.width,
    height: playable.video.height,
    sampleAspect: 1,
    workDir,
    signal,
    report,
    range: [plan.mode === "remux" ? 30 : 70, 93],
  });
  const facts: RecordingFacts = {
    detectedKind: kind,
    codec: source.video.codec,
    profile: source.video.profile ?? undefined,
    level: source.video.level,
    width: source.video.width,
    height: source.video.height,
    frameCount: playable.video.frameCount,
    durationSec,
    bitrate: source.bitrate,
    fps: source.video.fps,
    fpsSource: "container",
    playableMode: plan.mode,
    playableNote: plan.reason,
    audioCodec: source.audio?.codec ?? null,
    traceNotApplicable: "The signal trace reads raw H.264 controller streams; a camera recording in a container carries no record of link loss.",
  };
  const outputs = await hashOutputs(
    [
      { kind: "playable", file: PLAYABLE_FILE, mimeType: "video/mp4", width: playable.video.width, height: playable.video.height, tool: "ffmpeg", toolArgs: playableArgs },
      ...common,
    ],
    workDir,
    span(report, 93, 99, "sealing the outputs"),
  );
  // A container's rate as it states it; a variable-rate file's placeholder (e.g. 90000) is not a frame rate.
  const stated = source.video.fps;
  const fps = stated && stated > 0 && stated <= 240 ? stated : Math.min(240, Math.max(1, playable.video.frameCount / durationSec));
  const figures = computeRecordingFigures({
    frameRate: frameRateFromFps(fps),
    states: null,
    frameCount: playable.video.frameCount,
    durationSeconds: durationSec,
    rendition: plan.mode === "remux" ? "copy" : "transcode",
    pictureSizes: [{ width: source.video.width, height: source.video.height, fromSlot: 0 }],
  });
  return { facts, durationSec, figures, outputs, trace: null };
}

async function deriveFromStill(input: DeriveInput, report: Progress): Promise<DeriveResult> {
  const { signal, workDir } = input;
  let source: ContainerFacts;
  try {
    source = await readContainerFacts(input.originalPath, signal);
  } catch (err) {
    throw asRefusal(err);
  }
  if (!source.video) throw new RecordingRefused("The image cannot be read");
  let poster;
  try {
    poster = await makePoster({ sourcePath: input.originalPath, sourceName: "original", outDir: workDir, atSec: 0, signal });
  } catch (err) {
    throw asRefusal(err);
  }
  const posterSize = await readJpegSize(poster.path);
  const outputs = await hashOutputs(
    [{ kind: "poster", file: POSTER_FILE, mimeType: "image/jpeg", width: posterSize?.width ?? null, height: posterSize?.height ?? null, tool: "ffmpeg", toolArgs: poster.args }],
    workDir,
    span(report, 90, 99, "sealing the outputs"),
  );
  return {
    facts: {
      detectedKind: "jpeg",
      codec: source.video.codec,
      width: source.video.width,
      height: source.video.height,
      traceNotApplicable: "A still image has no signal trace.",
    },
    durationSec: null,
    figures: null,
    outputs,
    trace: null,
  };
}

type PendingOutput = Omit<DerivedOutput, "sizeBytes" | "sha256">;

async function deriveStillsAndThumbnails(o: {
  playablePath: string;
  durationSec: number;
  width: number;
  height: number;
  sampleAspect: number;
  workDir: string;
  signal: AbortSignal;
  report: Progress;
  /** Share of the overall progress this step covers. */
  range: [number, number];
}): Promise<PendingOutput[]> {
  const [from, to] = o.range;
  const plan = chooseThumbnailPlan({ durationSec: o.durationSec, width: o.width, height: o.height, sampleAspect: o.sampleAspect });
  const track = await makeThumbnailTrack({
    playablePath: o.playablePath,
    outDir: o.workDir,
    plan,
    signal: o.signal,
    onProgress: span(o.report, from, from + (to - from) * 0.9, "making thumbnails"),
  });
  const poster = await makePoster({ sourcePath: o.playablePath, sourceName: PLAYABLE_FILE, outDir: o.workDir, atSec: posterTimeSec(o.durationSec), signal: o.signal });
  const posterSize = await readJpegSize(poster.path);
  o.report(to, "sealing the outputs");
  return [
    { kind: "poster", file: POSTER_FILE, mimeType: "image/jpeg", width: posterSize?.width ?? null, height: posterSize?.height ?? null, tool: "ffmpeg", toolArgs: poster.args },
    {
      kind: "sprite",
      file: SPRITE_FILE,
      mimeType: "image/jpeg",
      width: plan.layout.spriteWidth,
      height: plan.layout.spriteHeight,
      tool: "ffmpeg",
      toolArgs: [...track.spriteArgs, "&&", "ffmpeg", ...track.tileArgs],
    },
    {
      kind: "thumbnails_vtt",
      file: THUMBNAILS_FILE,
      mimeType: "text/vtt",
      width: null,
      height: null,
      tool: "cairn thumbnail track",
      toolArgs: [
        `interval=${plan.layout.intervalMs}ms`,
        `tile=${plan.layout.tileWidth}x${plan.layout.tileHeight}`,
        `columns=${plan.layout.columns}`,
        `duration=${plan.layout.durationMs}ms`,
        `sprite=${SPRITE_FILE}`,
      ],
    },
  ];
}

async function hashOutputs(pending: PendingOutput[], workDir: string, onProgress: (p: number) => void): Promise<DerivedOutput[]> {
  const out: DerivedOutput[] = [];
  for (const [i, p] of pending.entries()) {
    const digest = await sha256OfStream(createReadStream(path.join(workDir, p.file), { highWaterMark: 1 << 20 }));
    out.push({ ...p, sizeBytes: digest.bytes, sha256: digest.hex });
    onProgress(((i + 1) / pending.length) * 100);
  }
  return out;
}

export type { StreamFacts };
