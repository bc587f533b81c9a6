// The processing worker end to end against the real Postgres, Redis and Debian ffmpeg: recordings
// placed as ingest leaves them, the job queued, the worker (in this process) drains the queue, and
// every output is checked by something other than our own code:
// - MP4 renditions by the npm mp4box parser (GPAC's MP4Box.js, ISO/IEC 14496-12/-15);
// - frame counts by `ffprobe -count_frames` on the source (ffprobe is the reference for stream facts);
// - the WebVTT track by the npm webvtt-parser package (W3C's webvtt.js), the sprite's real pixel size
//   by ffprobe;
// - hashes by Node's crypto (SHA-256, FIPS 180-4).
import { clientOf, tieClientAccount, untieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFile, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import os from "node:os";
import { and, eq } from "drizzle-orm";
import webvtt from "webvtt-parser";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, renditions, signalTraces } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, enqueue } from "@/lib/queue/jobs";
import { ensureQueued } from "@/lib/queue/ensure-queued";
import { storedSha256, storedText, withStoredFile } from "@/tests/support/stored-files";
import { statKey } from "@/lib/storage/store";
import { probeH264File } from "@/lib/h264/probe-stream";
import { startWorker, type RunningWorker } from "@/worker/start-worker";
import { recordingProgressReporter } from "@/worker/report-progress";
import * as reprocessRoute from "@/app/api/recordings/[id]/reprocess/route";
import * as traceRoute from "@/app/api/recordings/[id]/trace/route";
import * as progressRoute from "@/app/api/recordings/[id]/progress/route";
import { makeRawH264, runTool } from "@/tests/support/media/make-h264";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { waitForRecordings, waitJobs } from "@/tests/support/wait-jobs";
import { makeRecordingWithOriginal } from "@/tests/support/factories";
import { readMp4 } from "./support/read-mp4";
import { ffprobeFrameCount, ffprobeSize } from "./support/probe-tools";
import { readRecordingTrace } from "@/lib/recordings/read-recording-trace";

let worker: RunningWorker;
let orgId: string;
let actors: Record<DemoActorKey, Actor>;
let controllerStream: string; // 432x240, 30 fps, 3 s, Constrained Baseline, ~560 kbit/s
const scratch: string[] = [];
/** A file name for test media made here; removed after the run. */
const scratchFile = (name: string) => {
  const file = path.join(os.tmpdir(), `cairn-test-3-${process.pid}-${name}`);
  scratch.push(file);
  return file;
};

beforeAll(async () => {
  orgId = await demoOrganisationId();
  actors = await demoActors();
  controllerStream = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: 3, bitrate: 560, gop: 30 });
  worker = await startWorker({ only: ["process-recording"], log: () => {} });
});
afterAll(async () => {
  await Promise.all(scratch.map((f) => rm(f, { force: true })));
  await worker?.stop();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

async function processNow(file: string, over: Parameters<typeof makeRecordingWithOriginal>[2] = {}) {
  const rec = await makeRecordingWithOriginal(orgId, file, over);
  await enqueue("process-recording", { recordingId: rec.id });
  await waitForRecordings([rec.id]);
  return rec;
}

async function renditionsOf(recordingId: string) {
  const rows = await db().select().from(renditions).where(eq(renditions.recordingId, recordingId));
  return Object.fromEntries(rows.map((r) => [r.kind, r]));
}


describe("a raw H.264 controller stream (432x240, 30 fps, Constrained Baseline)", () => {
  let id: string;
  beforeAll(async () => {
    id = (await processNow(controllerStream)).id;
  });

  it("ends ready with facts equal to ffprobe's view of the source", async () => {
    const [row] = await db().select().from(recordings).where(eq(recordings.id, id));
    expect(row.failureReason).toBeNull();
    expect(row.state).toBe("ready");
    expect(row.progress).toBe(100);
    const sourceFrames = await ffprobeFrameCount(controllerStream, true);
    expect(row.facts).toMatchObject({ codec: "h264", profile: "Constrained Baseline", width: 432, height: 240, fps: 30, fpsSource: "stream" });
    expect(row.facts!.frameCount).toBe(sourceFrames);
    expect(row.durationSec).toBeCloseTo(sourceFrames / 30, 9);
  });

  it("makes an MP4 that mp4box reads as avc1.42..., 432x240, with ffprobe's frame count and frames/fps duration", async () => {
    const r = await renditionsOf(id);
    const mp4 = await withStoredFile(r.playable.storageKey, readMp4);
    expect(mp4.videoTracks).toHaveLength(1);
    const v = mp4.videoTracks[0];
    // RFC 6381 codec string: avc1.PPCCLL, profile_idc 0x42 = 66 (Baseline family)
    expect(v.codec).toMatch(/^avc1\.42[0-9a-f]{4}$/i);
    expect([v.width, v.height]).toEqual([432, 240]);
    const sourceFrames = await ffprobeFrameCount(controllerStream, true);
    expect(v.samples).toBe(sourceFrames);
    expect(Math.abs(v.durationSec - sourceFrames / 30)).toBeLessThanOrEqual(1 / 30);
    // +faststart: the moov box comes before the media data, so mp4box calls the file progressive
    expect(mp4.isProgressive).toBe(true);
  });

  it("stores four renditions whose files hash to the stored SHA-256", async () => {
    const r = await renditionsOf(id);
    expect(Object.keys(r).sort()).toEqual(["playable", "poster", "sprite", "thumbnails_vtt"]);
    for (const row of Object.values(r)) {
      expect(await storedSha256(row.storageKey)).toBe(row.sha256);
      expect((await statKey(row.storageKey))?.size).toBe(row.sizeBytes);
    }
    expect(r.playable.toolArgs).toEqual(expect.arrayContaining(["-f", "h264", "-r", "30", "-c:v", "copy", "+faststart"]));
    const poster = await withStoredFile(r.poster.storageKey, ffprobeSize);
    expect(poster).toEqual({ codec: "mjpeg", width: 432, height: 240 });
    expect([r.poster.width, r.poster.height]).toEqual([poster.width, poster.height]);
  });

  it("writes a WebVTT track that an independent parser reads: ordered cues covering the duration, boxes inside the sprite", async () => {
    const r = await renditionsOf(id);
    const text = await storedText(r.thumbnails_vtt.storageKey);
    const parsed = new webvtt.WebVTTParser().parse(text, "metadata");
    expect(parsed.errors).toEqual([]);
    const cues = parsed.cues;
    expect(cues.length).toBeGreaterThan(0);
    expect(cues[0].startTime).toBe(0);
    for (let i = 1; i < cues.length; i++) {
      expect(cues[i].startTime).toBeGreaterThanOrEqual(cues[i - 1].startTime);
      expect(cues[i].startTime).toBeCloseTo(cues[i - 1].endTime, 6); // no holes
    }
    const [row] = await db().select({ durationSec: recordings.durationSec }).from(recordings).where(eq(recordings.id, id));
    expect(cues.at(-1)!.endTime).toBeCloseTo(row.durationSec!, 3);
    const sprite = await withStoredFile(r.sprite.storageKey, ffprobeSize);
    expect(sprite.codec).toBe("mjpeg");
    expect([sprite.width, sprite.height]).toEqual([r.sprite.width, r.sprite.height]);
    for (const cue of cues) {
      // W3C Media Fragments: #xywh=x,y,w,h in pixels
      const m = /^sprite\.jpg#xywh=(\d+),(\d+),(\d+),(\d+)$/.exec(cue.text.trim());
      expect(m, cue.text).not.toBeNull();
      const [x, y, w, h] = m!.slice(1).map(Number);
      expect(w).toBeGreaterThan(0);
      expect(h).toBeGreaterThan(0);
      expect(x + w).toBeLessThanOrEqual(sprite.width);
      expect(y + h).toBeLessThanOrEqual(sprite.height);
    }
  });

  it("stores a clean signal trace: every frame intact, no loss", async () => {
    const [trace] = await db().select().from(signalTraces).where(eq(signalTraces.recordingId, id));
    const frames = await ffprobeFrameCount(controllerStream, true);
    expect(trace.intervals).toEqual([{ state: "intact", startFrame: 0, endFrame: frames, startSec: 0, endSec: frames / 30 }]);
    expect(trace.summary).toMatchObject({ frameCount: frames, lostFrames: 0, damagedFrames: 0, intactShare: 1, firstDegradationSec: null, longestLossSec: 0 });
    expect(trace.decoderErrorFrames).toEqual([]);
  });

  it("records one processing event and one derived event per output in the custody log", async () => {
    const events = await db().select().from(custodyEvents).where(eq(custodyEvents.organisationId, orgId));
    const r = await renditionsOf(id);
    const mine = events.filter((e) => e.evidenceId === id || Object.values(r).some((x) => x.id === e.evidenceId));
    expect(mine.filter((e) => e.eventType === "processing")).toHaveLength(1);
    const derived = mine.filter((e) => e.eventType === "derived");
    expect(derived).toHaveLength(5); // four files and the signal trace
    for (const row of Object.values(r)) {
      const e = derived.find((d) => d.evidenceId === row.id)!;
      expect(e.outputSha256).toBe(row.sha256);
      expect(e.toolArgs).toEqual(row.toolArgs);
    }
  });

  it("running the job again leaves one identical set of renditions and records no second run", async () => {
    const before = await renditionsOf(id);
    expect(await ensureQueued("process-recording", { recordingId: id })).toBe("replaced-finished");
    await waitJobs({ names: ["process-recording"] });
    await waitForRecordings([id]);
    const after = await renditionsOf(id);
    expect(Object.keys(after).sort()).toEqual(Object.keys(before).sort());
    for (const kind of Object.keys(before)) {
      expect(after[kind].id).toBe(before[kind].id);
      expect(after[kind].sha256).toBe(before[kind].sha256);
      expect(await storedSha256(after[kind].storageKey)).toBe(before[kind].sha256);
    }
    const processing = await db()
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.evidenceId, id), eq(custodyEvents.eventType, "processing")));
    // a finished recording is not processed again by a duplicate job (the reconciler may queue one
    // after Redis lost the first while it ran); reprocessing goes through "waiting" (the reprocess route)
    expect(processing).toHaveLength(1);
  });

  it("serves the trace and the progress through the API, to the organisation only", async () => {
    const res = await traceRoute.GET(await req(actors.reviewer, "GET", `/api/recordings/${id}/trace`), route({ id }));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.applicable).toBe(true);
    expect(body.intervals[0]).toMatchObject({ state: "intact", playableStartSec: 0 });
    expect(body.summary.intactShare).toBe(1);
    // a client account sees the progress of its own clients' recordings only
    const asClient = async () => progressRoute.GET(await req(actors.client, "GET", `/api/recordings/${id}/progress`), route({ id }));
    const clientId = await clientOf({ recordingId: id });
    await untieClientAccount(actors.client!, clientId);
    expect((await asClient()).status).toBe(404);
    await tieClientAccount(actors.client!, clientId);
    expect(await (await asClient()).json()).toMatchObject({ id, state: "ready", progress: 100, failureReason: null });
    const sse = await progressRoute.GET(await req(actors.pilot, "GET", "/x", undefined, { accept: "text/event-stream" }), route({ id }));
    expect(sse.headers.get("content-type")).toMatch(/^text\/event-stream/);
    // A ready recording: one event, then the stream ends.
    const text = await sse.text();
    expect(text).toMatch(/^event: progress\ndata: \{.*"state":"ready".*\}\n\n$/s);
    expect((await traceRoute.GET(await req(actors.other, "GET", "/x"), route({ id }))).status).toBe(404);
    expect((await progressRoute.GET(await req(actors.anonymous, "GET", "/x"), route({ id }))).status).toBe(401);
  });
});

describe("frame rate", () => {
  it("an override set through the reprocess route re-times the MP4: duration = frames / 25", async () => {
    const rec = await processNow(controllerStream);
    const frames = await ffprobeFrameCount(controllerStream, true);
    const cases: [DemoActorKey, unknown, number][] = [
      ["reviewer", { fps: 25 }, 403],
      ["other", { fps: 25 }, 404],
      ["pilot", { fps: 0 }, 422],
      ["pilot", { fps: 1000 }, 422],
      ["pilot", { fps: "25" }, 422],
      ["pilot", "{fps:", 400],
    ];
    for (const [who, body, status] of cases) {
      const res = await reprocessRoute.POST(await req(actors[who], "POST", "/x", body), route({ id: rec.id }));
      expect(res.status, `${who} ${JSON.stringify(body)}`).toBe(status);
    }
    const res = await reprocessRoute.POST(await req(actors.pilot, "POST", "/x", { fps: 25 }), route({ id: rec.id }));
    expect(res.status).toBe(202);
    expect(await res.json()).toMatchObject({ id: rec.id, state: "waiting", fpsOverride: 25 });
    await waitJobs({ names: ["process-recording"] });
    const [row] = await waitForRecordings([rec.id]).then(() => db().select().from(recordings).where(eq(recordings.id, rec.id)));
    expect(row.state).toBe("ready");
    expect(row.facts).toMatchObject({ fps: 25, fpsSource: "recording-override", frameCount: frames });
    const mp4 = await withStoredFile((await renditionsOf(rec.id)).playable.storageKey, readMp4);
    expect(mp4.videoTracks[0].samples).toBe(frames);
    expect(Math.abs(mp4.videoTracks[0].durationSec - frames / 25)).toBeLessThanOrEqual(1 / 25);
  });
});

describe("a 1920x1080 stream (coded as 1920x1088, cropped by the SPS)", () => {
  it("keeps the cropped size in the facts and the MP4", async () => {
    const file = await makeRawH264({ width: 1920, height: 1080, fps: 30, seconds: 1, bitrate: 2000, gop: 30, preset: "ultrafast" });
    const rec = await processNow(file);
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.state).toBe("ready");
    // ITU-T H.264 7.4.2.1.1: 120 macroblock rows = 1088 lines, frame_crop_bottom_offset 4 x CropUnitY 2 = 8 lines off
    expect(row.facts).toMatchObject({ width: 1920, height: 1080, codedWidth: 1920, codedHeight: 1088 });
    const mp4 = await withStoredFile((await renditionsOf(rec.id)).playable.storageKey, readMp4);
    expect([mp4.videoTracks[0].width, mp4.videoTracks[0].height]).toEqual([1920, 1080]);
    expect(mp4.videoTracks[0].samples).toBe(await ffprobeFrameCount(file, true));
    expect(await withStoredFile((await renditionsOf(rec.id)).playable.storageKey, ffprobeSize)).toMatchObject({ width: 1920, height: 1080 });
  });
});

describe("a stream that starts mid-GOP", () => {
  it("is re-encoded on the recorder's clock: one MP4 frame per frame slot, the first picture held until the first IDR", async () => {
    // The recorder started writing at the 6th frame of a GOP of 30: 25 P frames before the next IDR.
    const whole = await probeH264File(controllerStream);
    const offsets = whole.trace.offsets;
    const cutAt = offsets[5];
    const bytes = await readFile(controllerStream);
    const file = scratchFile("midgop.264");
    await writeFile(file, bytes.subarray(cutAt));
    const rec = await processNow(file);
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.failureReason).toBeNull();
    // Frames before the first IDR cannot be decoded exactly: the stream counts as damaged and is
    // re-encoded so that the MP4's time of frame slot k is k / fps, as on the recorder.
    expect(row.facts).toMatchObject({ startsWithIdr: false, playableFirstFrame: 0, playableMode: "reencode", streamFrameCount: whole.facts.frameCount - 5 });
    const mp4 = await withStoredFile((await renditionsOf(rec.id)).playable.storageKey, readMp4);
    // ffprobe on the cut source decodes from the first IDR: 25 frames fewer than the MP4, which holds
    // the first IDR picture over those 25 slots.
    expect(mp4.videoTracks[0].samples).toBe(whole.facts.frameCount - 5);
    expect(mp4.videoTracks[0].samples).toBe((await ffprobeFrameCount(file, true)) + 25);
    expect(row.figures).toMatchObject({ frameSlots: whole.facts.frameCount - 5, framesLost: 0, rendition: "reencode" });
    const [trace] = await db().select().from(signalTraces).where(eq(signalTraces.recordingId, rec.id));
    // Frames before the first IDR cannot be decoded exactly: damaged, then intact from the IDR on.
    expect(trace.intervals[0]).toMatchObject({ state: "damaged", startFrame: 0, endFrame: 25 });
    expect(trace.intervals[1]).toMatchObject({ state: "intact", startFrame: 25 });
  });
});

describe("a stream with lost frames", () => {
  it("marks the loss where the access units were removed, in agreement with ffmpeg's decoder", async () => {
    // Remove access units 40, 41 and 42 (P frames; IDR at 30 and 60): a frame_num gap of 3.
    const whole = await probeH264File(controllerStream);
    const bytes = await readFile(controllerStream);
    const o = whole.trace.offsets;
    const file = scratchFile("lost.264");
    await writeFile(file, Buffer.concat([bytes.subarray(0, o[40]), bytes.subarray(o[43])]));
    const rec = await processNow(file);
    const [trace] = await db().select().from(signalTraces).where(eq(signalTraces.recordingId, rec.id));
    const lost = trace.intervals.filter((i) => i.state === "lost");
    expect(lost).toHaveLength(1);
    expect(Math.abs(lost[0].startFrame - 40)).toBeLessThanOrEqual(1);
    expect(lost[0].endFrame - lost[0].startFrame).toBe(3);
    expect(trace.summary.longestLossSec).toBeCloseTo(3 / 30, 9);
    expect(trace.summary.firstDegradationSec).toBeCloseTo(40 / 30, 1);
    // Frames after the gap predict from missing references until the IDR at slot 60.
    expect(trace.intervals.find((i) => i.state === "damaged")).toMatchObject({ startFrame: 43, endFrame: 60 });
    const summary = trace.summary as typeof trace.summary & { decoderAgreement: { decoderGaps: number } | null };
    // ffprobe's decoder infers the same gap (holes in coded_picture_number) right after it.
    expect(summary.decoderAgreement?.decoderGaps).toBe(1);
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.state).toBe("ready");
    // Frame slots: the 3 lost frames keep their place (the clean source's frame count).
    expect(row.facts!.frameCount).toBe(whole.facts.frameCount);
    expect(row.figures).toMatchObject({ frameSlots: whole.facts.frameCount, framesLost: 3, framesLostIsLowerBound: false, rendition: "reencode" });
    expect(row.durationSec).toBe(whole.facts.frameCount / 30);
    // The trace as the pages get it: the rendition keeps the recorder's clock, so a lost interval
    // takes its own time in the player too, and the stored figures come along.
    const view = await readRecordingTrace(row.organisationId, rec.id);
    if (!view.applicable) throw new Error("expected a trace");
    const lostView = view.intervals.find((i) => i.state === "lost")!;
    expect(lostView.playableStartSec).toBe(lostView.startSec);
    expect(lostView.playableEndSec - lostView.playableStartSec).toBeCloseTo(3 / 30, 9);
    expect(view.figures).toMatchObject({ frameSlots: whole.facts.frameCount, framesLost: 3 });
  });
});

describe("progress reporting", () => {
  it("goes to the job and to Postgres, throttled, in whole percents, never backwards, never 100 before the commit", async () => {
    const rec = await makeRecordingWithOriginal(orgId, controllerStream);
    const seen: number[] = [];
    let clock = 0;
    const reporter = recordingProgressReporter({ updateProgress: async (p: unknown) => void seen.push(p as number) }, rec.id, () => clock);
    const readRow = async () => (await db().select({ progress: recordings.progress }).from(recordings).where(eq(recordings.id, rec.id)))[0].progress;
    clock = 10_000;
    reporter.report(12.7);
    reporter.report(30); // within 1.5 s of the last write: skipped
    clock = 12_000;
    reporter.report(8); // backwards: skipped
    reporter.report(140); // clamped, and 100 is kept for the commit
    await reporter.flush();
    expect(seen).toEqual([12, 99]);
    expect(await readRow()).toBe(99);
  });
});

describe("camera recordings in a container", () => {
  it("H.264 + AAC in MP4 is remuxed without re-encoding, audio kept; no signal trace", async () => {
    const file = scratchFile("camera-h264-aac.mp4");
    await runTool("ffmpeg", ["-v", "error", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x240:rate=25", "-f", "lavfi", "-i", "sine=frequency=440",
      "-t", "2", "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", "-c:a", "aac", "-shortest", file]);
    const rec = await processNow(file, { kind: "mp4" });
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.failureReason).toBeNull();
    expect(row.facts).toMatchObject({ codec: "h264", width: 320, height: 240, fps: 25, fpsSource: "container", playableMode: "remux", audioCodec: "aac" });
    const mp4 = await withStoredFile((await renditionsOf(rec.id)).playable.storageKey, readMp4);
    expect(mp4.videoTracks[0].samples).toBe(await ffprobeFrameCount(file));
    expect(mp4.audioTracks).toBe(1);
    expect(await db().select().from(signalTraces).where(eq(signalTraces.recordingId, rec.id))).toEqual([]);
    const trace = await (await traceRoute.GET(await req(actors.reviewer, "GET", "/x"), route({ id: rec.id }))).json();
    expect(trace).toMatchObject({ applicable: false, reason: expect.stringMatching(/raw H\.264 controller streams/) });
  });

  it("H.265 is transcoded to H.264 that mp4box reads as avc1, with every frame kept", async () => {
    const file = scratchFile("camera-hevc.mp4");
    await runTool("ffmpeg", ["-v", "error", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x240:rate=25", "-t", "1",
      "-c:v", "libx265", "-preset", "ultrafast", "-x265-params", "log-level=error", "-pix_fmt", "yuv420p", "-tag:v", "hvc1", file]);
    const rec = await processNow(file, { kind: "mp4" });
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.failureReason).toBeNull();
    expect(row.facts).toMatchObject({ codec: "hevc", playableMode: "transcode" });
    const r = await renditionsOf(rec.id);
    const mp4 = await withStoredFile(r.playable.storageKey, readMp4);
    expect(mp4.videoTracks[0].codec).toMatch(/^avc1\./);
    expect([mp4.videoTracks[0].width, mp4.videoTracks[0].height]).toEqual([320, 240]);
    expect(mp4.videoTracks[0].samples).toBe(await ffprobeFrameCount(file));
    expect(r.playable.toolArgs).toEqual(expect.arrayContaining(["-c:v", "libx264", "-preset", "veryfast", "-crf", "23"]));
  });
});
