// A damaged recording in a real browser (Debian chromium) against the built app and the real worker.
// The source is the counter stream (its 0-based frame number burned in) with damage made in Node
// (tests/support/media/make-damaged-h264.ts): 13 P pictures cut out mid-group (slots 40-52), 5 with
// scrambled slice data (100-104) and the last 10 of a group cut out just before the IDR at 150
// (140-149). 180 recorder frame slots, 23 lost. The page must play it from start to end, keep the
// recorder's time (a frame's time is its slot / the frame rate), step frames after the damage, and
// mark a finding whose still is the right recorder frame: compared pixel by pixel with ffmpeg's own
// decode of that frame of the clean stream (`select=eq(n\,N)`), as the still-extraction test does.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { mkdir } from "node:fs/promises";
import path from "node:path";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { demoActors, demoOrganisationId } from "@/tests/support/session";
import { makeFlight, makeJob } from "@/tests/support/factories";
import { makeCounterH264, makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { makeDamagedH264 } from "@/tests/support/media/make-damaged-h264";
import { describeMoment } from "@/lib/findings/describe-moment";
import { describeLostFrames, readRecordingFigures } from "@/lib/recordings/recording-figures";
import { diskPath } from "@/tests/support/stored-files";
import { MIN_MARK_WIDTH_PX } from "@/components/trace/layout-trace-band";
import { readFile } from "node:fs/promises";
import { readPdfText } from "@/tests/support/read-pdf-text";

const FPS = 30;
const W = 320;
const H = 180;
const SLOTS = 180;
const range = (from: number, to: number) => Array.from({ length: to - from }, (_, i) => from + i);
const REMOVED = [...range(40, 53), ...range(140, 150)];
const SCRAMBLED = range(100, 105);
const SHOTS = path.resolve(".data/screenshots");

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let rec: ProcessedRecording;
let second: ProcessedRecording;
let cleanPath: string;
let jobId: string;
let markedFrame: number;

const video = () => page.locator("[data-testid=review-video] video");
const videoState = () =>
  page.evaluate(() => {
    const v = document.querySelector("[data-testid=review-video] video") as HTMLVideoElement;
    return { t: v.currentTime, d: v.duration, ended: v.ended, paused: v.paused, error: v.error?.code ?? null };
  });
const frameText = () => page.getByTestId("frame-number").innerText();

/** The picture the browser paints now, as 8-bit luma (BT.601 weights, as ffmpeg's gray conversion). */
async function paintedGray(): Promise<Buffer> {
  const gray = await page.evaluate(
    ([w, h]) => {
      const v = document.querySelector("[data-testid=review-video] video") as HTMLVideoElement;
      const c = document.createElement("canvas");
      c.width = w;
      c.height = h;
      const g = c.getContext("2d")!;
      g.drawImage(v, 0, 0, w, h);
      const px = g.getImageData(0, 0, w, h).data;
      const out: number[] = [];
      for (let i = 0; i < px.length; i += 4) out.push(Math.round(0.299 * px[i] + 0.587 * px[i + 1] + 0.114 * px[i + 2]));
      return out;
    },
    [W, H] as const,
  );
  return Buffer.from(gray);
}

/** ffmpeg decoding to raw 8-bit gray, stdout as bytes. */
function decodeGray(args: string[]): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const child = spawn("ffmpeg", ["-v", "error", ...args, "-f", "rawvideo", "-pix_fmt", "gray", "-"], { stdio: ["ignore", "pipe", "pipe"] });
    const chunks: Buffer[] = [];
    let err = "";
    child.stdout.on("data", (c: Buffer) => chunks.push(c));
    child.stderr.on("data", (c: Buffer) => (err += c));
    child.on("close", (code) => (code === 0 ? resolve(Buffer.concat(chunks)) : reject(new Error(err))));
  });
}
// frame n of the clean stream, counted by ffmpeg from the start: the independent reference for slot n
const cleanFrame = (n: number) => decodeGray(["-f", "h264", "-i", cleanPath, "-vf", `select=eq(n\\,${n})`, "-vsync", "0", "-frames:v", "1"]);
const meanAbsDiff = (a: Buffer, b: Buffer) => {
  expect(a.length).toBe(b.length);
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += Math.abs(a[i] - b[i]);
  return sum / a.length;
};

beforeAll(async () => {
  await mkdir(SHOTS, { recursive: true });
  const actors = await demoActors();
  const orgId = await demoOrganisationId();
  const job = await makeJob(orgId, { title: "Damaged playback e2e job", reviewerId: actors.reviewer!.userId, pilotId: actors.pilot!.userId });
  jobId = job.id;
  const flight = await makeFlight(orgId, { jobId: job.id });
  cleanPath = await makeCounterH264({ seconds: SLOTS / FPS, fps: FPS, width: W, height: H, gop: 30 });
  const damaged = await makeDamagedH264(cleanPath, { remove: REMOVED, scramble: SCRAMBLED }, "e2e-damaged-playback");
  rec = await makeProcessedRecording(orgId, flight, { source: damaged, name: "FADE0001.264" });
  // the recorder closed this file and, after the link came back 12 s later, a second one (2 s, clean)
  second = await makeProcessedRecording(orgId, flight, { seconds: 2, fps: FPS, width: W, height: H, gop: 30, name: "FADE0002.264", sequenceIndex: 1 });
  await db().update(s.recordings).set({ recorderModifiedAt: new Date("2026-03-14T10:00:06Z") }).where(eq(s.recordings.id, rec.recording.id));
  await db().update(s.recordings).set({ recorderModifiedAt: new Date("2026-03-14T10:00:20Z") }).where(eq(s.recordings.id, second.recording.id));
  browser = await launch();
  ctx = await newContext(browser);
  page = await ctx.newPage();
  await signInWithPassword(page, "reviewer@kestrelmoor.example");
}, 180_000);
afterAll(async () => {
  await ctx?.close();
  await browser?.close();
  await closeDb();
});

describe("a damaged recording in the review room", () => {
  it("is stored with the recorder's frame slots and its lost frames", () => {
    const figures = readRecordingFigures(rec.recording);
    expect(figures).not.toBeNull();
    expect(figures!.frameSlots).toBe(SLOTS);
    expect(figures!.framesLost).toBe(REMOVED.length);
    expect(figures!.durationSeconds).toBeCloseTo(SLOTS / FPS, 9);
  });

  it("shows slots, lost frames, duration and the numbered link events", async () => {
    const figures = readRecordingFigures(rec.recording)!;
    await page.goto(`/recordings/${rec.recording.id}`);
    await page.getByRole("heading", { name: "FADE0001.264" }).waitFor();
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await expect.poll(frameText).toContain(`of ${SLOTS}, ${describeLostFrames(figures)} lost`);
    expect(await page.getByTestId("duration").innerText()).toContain("00:00:06.000");
    const events = page.getByTestId("trace-event");
    await events.first().waitFor();
    // numbered in time order, in the crew's words; the first loss is 13 frames at slot 40
    // each button's name is its visible text (no separate label), then what it does
    const labels = await page.locator("[data-testid=trace-event] button").evaluateAll((els) => els.map((e) => (e.textContent ?? "").replace(/\s+/g, " ").trim()));
    expect(labels[0]).toMatch(/^1\. Video lost at 00:00:01\.334, frame 40, (at least )?13 frames, 0\.433 s: go there$/);
    expect(labels.map((l) => Number(/^(\d+)\./.exec(l)![1]))).toEqual(labels.map((_, i) => i + 1));
    const frames = labels.map((l) => Number(/, frame (\d+)/.exec(l)![1]));
    expect(frames).toEqual([...frames].sort((a, b) => a - b));
    const kinds = await events.evaluateAll((els) => els.map((e) => e.getAttribute("data-event")));
    expect(kinds).toContain("reacquired");
    expect(kinds).toContain("first_degradation");
    expect(labels.join(" ")).toMatch(/Video back/);
    expect(labels.join(" ")).toMatch(/Picture breaking up/);
    expect(labels.join(" ")).not.toMatch(/Total loss|Reacquired|First degradation/);
    // one moment, one label: the summary's first degradation is the first event's frame time
    expect(await page.getByRole("region", { name: "Signal trace" }).getByTestId("first-degradation").innerText()).toBe("at 00:00:01.334");
    // the flight header: the first degradation at the same label, and the outage between the files as loss
    const flight = page.getByRole("region", { name: "Flight timeline" });
    await flight.getByTestId("first-degradation").waitFor();
    expect(await flight.getByTestId("first-degradation").innerText()).toBe("at 00:00:01.334 (flight time)");
    expect(await flight.innerText()).toContain("Video lost between files for about 12.0 s (estimated from the recorder's file times)");
    expect(await flight.innerText()).toMatch(/about 12\.000 s \(between files, estimated\)/);
    // the 13-frame loss is drawn at least MIN_MARK_WIDTH_PX wide, and taller than the band
    const lost = page.locator("[data-testid=trace-band] button[data-state=lost]").first();
    const lostBox = (await lost.boundingBox())!;
    expect(lostBox.width).toBeGreaterThanOrEqual(MIN_MARK_WIDTH_PX);
    expect(lostBox.height).toBeGreaterThan((await page.locator("[data-testid=trace-band] button[data-state=intact]").first().boundingBox())!.height);
    await page.getByTestId("trace-band").scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SHOTS, "damaged-band.png"), fullPage: false });
    await flight.scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SHOTS, "damaged-flight.png"), fullPage: false });
  });

  it("plays from start to end, with the recorder's duration", { timeout: 60_000 }, async () => {
    await page.getByRole("heading", { name: "FADE0001.264" }).click();
    await page.keyboard.press("Home");
    await expect.poll(frameText).toContain("frame 0 ");
    await page.keyboard.press("k");
    await expect.poll(async () => (await videoState()).ended, { timeout: 40_000, interval: 250 }).toBe(true);
    const st = await videoState();
    expect(st.error).toBeNull();
    // the rendition keeps the recorder's time: 180 slots at 30 fps, lost frames held, not dropped
    expect(st.d).toBeGreaterThan((SLOTS - 1) / FPS);
    expect(st.d).toBeLessThan((SLOTS + 1) / FPS);
    expect(st.t).toBeGreaterThanOrEqual(st.d - 1 / FPS);
    await expect.poll(frameText).toContain(`frame ${SLOTS - 1} `);
    // the re-encoded rendition plays through on its own: the decode-error safety net never acted
    expect(await page.getByTestId("decode-recovery-note").count()).toBe(0);
  });

  it("seeks past the damage, steps frames, and marks a finding whose still is that recorder frame", { timeout: 120_000 }, async () => {
    // "Video back" after the scrambled pictures (100-104): the picture is clear again by the IDR at 120
    const backs = page.locator("[data-testid=trace-event][data-event=reacquired] button");
    const backLabels = await backs.evaluateAll((els) => els.map((e) => (e.textContent ?? "").replace(/\s+/g, " ").trim()));
    const backFrames = backLabels.map((l) => Number(/, frame (\d+)/.exec(l)![1]));
    const i = backFrames.findIndex((f) => f > 104 && f <= 130);
    expect(i, `a "Video back" event between the scrambled pictures and slot 130: ${backLabels.join(" | ")}`).toBeGreaterThanOrEqual(0);
    const back = backFrames[i];
    // by keyboard: the events are buttons in the tab order
    await backs.nth(i).focus();
    await page.keyboard.press("Enter");
    await expect.poll(frameText).toContain(`frame ${back} `);
    await page.getByRole("heading", { name: "FADE0001.264" }).click();
    for (let k = 0; k < 3; k++) await page.keyboard.press(".");
    const n = back + 3;
    await expect.poll(frameText).toContain(`frame ${n} `);
    // the picture is really at slot n: n/30 s <= currentTime < (n+1)/30 s
    await expect.poll(async () => (await videoState()).t).toBeGreaterThanOrEqual(n / FPS);
    expect((await videoState()).t).toBeLessThan((n + 1) / FPS);
    expect(await page.getByTestId("clock-time").innerText()).toBe(describeMoment(n, { num: FPS, den: 1 }).clock);
    await page.screenshot({ path: path.join(SHOTS, "damaged-readout.png") });

    await page.keyboard.press("m");
    const form = page.getByRole("form", { name: "Mark a finding" });
    await form.waitFor();
    expect(await form.getByTestId("draft-start").innerText()).toContain(`frame ${n}`);
    await form.locator("input[name=severity][value=minor]").check();
    await form.getByRole("button", { name: "Save finding" }).click();
    await form.waitFor({ state: "detached" });
    await page.getByTestId("finding-still").first().waitFor({ timeout: 60_000 });

    const [finding] = await db().select().from(s.findings).where(eq(s.findings.recordingId, rec.recording.id));
    expect(finding.startFrame).toBe(n);
    markedFrame = n;
    const [still] = await db().select().from(s.stills).where(eq(s.stills.findingId, finding.id));
    expect(still.state).toBe("ready");
    const mine = await decodeGray(["-i", diskPath(still.storageKey!)]);
    const same = meanAbsDiff(mine, await cleanFrame(n));
    // the neighbours, and the frame a player that dropped the 13 lost slots would show there
    const neighbours = [meanAbsDiff(mine, await cleanFrame(n - 1)), meanAbsDiff(mine, await cleanFrame(n + 1)), meanAbsDiff(mine, await cleanFrame(n + 13))];
    if (process.env.CAIRN_PRINT_FIGURES) console.log(`still of slot ${n}: vs clean ${n} ${same.toFixed(3)}, vs ${n - 1}/${n + 1}/${n + 13} ${neighbours.map((x) => x.toFixed(3)).join(" / ")}`);
    // the re-encoded rendition differs a little from the clean stream; a neighbour (other counter,
    // moved pattern) differs several times more (measured: 0.85 to 0.98 levels of 255 against 4.6 / 6.5 / 16.7)
    for (const other of neighbours) expect(other).toBeGreaterThan(same * 3);
  });

  it("after the loss at the end of a group, frames still sit at their recorder slots", async () => {
    await page.goto(`/recordings/${rec.recording.id}?frame=155`);
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await expect.poll(frameText).toContain("frame 155 ");
    await expect.poll(async () => (await videoState()).t).toBeGreaterThanOrEqual(155 / FPS);
    expect((await videoState()).t).toBeLessThan(156 / FPS);
    // what the browser paints there is the clean stream's frame 155 (checked through a canvas)
    const painted = await paintedGray();
    const same = meanAbsDiff(painted, await cleanFrame(155));
    const other = Math.min(meanAbsDiff(painted, await cleanFrame(154)), meanAbsDiff(painted, await cleanFrame(156)), meanAbsDiff(painted, await cleanFrame(165)));
    if (process.env.CAIRN_PRINT_FIGURES) console.log(`painted slot 155: vs clean 155 ${same.toFixed(3)}, nearest other ${other.toFixed(3)}`);
    expect(other).toBeGreaterThan(same * 3); // measured: 0.89 to 0.97 against 6.5
    await video().scrollIntoViewIfNeeded();
  });

  it("inside a loss the readout says so and the picture is the last frame before it, held", { timeout: 60_000 }, async () => {
    await page.goto(`/recordings/${rec.recording.id}?frame=45`);
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await expect.poll(frameText).toContain("frame 45 ");
    await expect.poll(() => page.getByTestId("frame-link-state").innerText()).toContain("Video lost here: last frame held");
    await expect.poll(async () => (await videoState()).t).toBeGreaterThanOrEqual(45 / FPS);
    const painted = await paintedGray();
    const held = meanAbsDiff(painted, await cleanFrame(39));
    const other = Math.min(meanAbsDiff(painted, await cleanFrame(45)), meanAbsDiff(painted, await cleanFrame(38)), meanAbsDiff(painted, await cleanFrame(53)));
    if (process.env.CAIRN_PRINT_FIGURES) console.log(`painted slot 45 (lost): vs clean 39 ${held.toFixed(3)}, nearest other ${other.toFixed(3)}`);
    expect(other).toBeGreaterThan(held * 3);
    // one step on, still inside the loss; the step after the loss leaves it
    await page.getByRole("heading", { name: "FADE0001.264" }).click();
    await page.keyboard.press(".");
    await expect.poll(frameText).toContain("frame 46 ");
    expect(await page.getByTestId("frame-link-state").innerText()).toContain("Video lost");
    await page.screenshot({ path: path.join(SHOTS, "damaged-inside-loss.png") });
  });

  it("the report prints the same figures and times", { timeout: 120_000 }, async () => {
    await page.goto(`/jobs/${jobId}/report`);
    await page.getByRole("button", { name: "Build report" }).click();
    const version = page.getByTestId("report-version").first();
    await expect.poll(async () => version.getAttribute("data-state"), { timeout: 90_000, interval: 500 }).toBe("ready");
    const [download] = await Promise.all([page.waitForEvent("download"), version.getByTestId("report-download").click()]);
    const text = (await readPdfText(await readFile((await download.path())!))).text.replace(/\s+/g, " ");
    expect(text).toContain("00:00:06.000");
    expect(text).toContain(`${SLOTS} frame slots, ${REMOVED.length} lost`);
    expect(text).toContain("first degradation at 00:00:01.334 (frame 40)");
    expect(text).toContain(describeMoment(markedFrame, { num: FPS, den: 1 }).clock);
  });

  it("a lost whole group of pictures reads 'at least' in the readout, the band and the summary", { timeout: 120_000 }, async () => {
    // pictures 60-89 cut out, the IDR at 60 with them: x264 alternates idr_pic_id 0/1, so the IDRs
    // before and after the gap carry the same id and the stream only tells "an odd number of groups"
    const orgId = await demoOrganisationId();
    const flight = await makeFlight(orgId, { jobId });
    const groupLost = await makeDamagedH264(cleanPath, { remove: range(60, 90), scramble: [] }, "e2e-damaged-group-lost");
    const r = await makeProcessedRecording(orgId, flight, { source: groupLost, name: "GROUP0001.264" });
    const figures = readRecordingFigures(r.recording)!;
    expect(figures.framesLostIsLowerBound).toBe(true);
    expect(figures.framesLost).toBeGreaterThanOrEqual(30);
    await page.goto(`/recordings/${r.recording.id}`);
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await expect.poll(frameText).toContain(`of ${figures.frameSlots}, at least ${figures.framesLost} lost`);
    const summary = page.getByRole("region", { name: "Signal trace" });
    expect(await summary.getByTestId("lost-frames").innerText()).toBe(`at least ${figures.framesLost}`);
    const labels = await page.locator("[data-testid=trace-event][data-event=total_loss] button").evaluateAll((els) => els.map((e) => (e.textContent ?? "").replace(/\s+/g, " ").trim()));
    expect(labels.length).toBeGreaterThan(0);
    for (const l of labels) expect(l).toMatch(/Video lost at .*, at least \d+ frames?, /);
    await page.getByTestId("trace-band").scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SHOTS, "damaged-at-least.png") });
  });
});
