// The review room in a real browser (Debian chromium) against the built app and the real worker:
// as the demo reviewer, open a processed recording, play a moment (analytics beacons go to the app's
// own collector), step frames with the keyboard and check the readouts against the video element,
// preview a scrub thumbnail, mark a finding with a box, see its marker and its still (extracted by
// the worker), then build the job's report and download the PDF, read back with pdfjs-dist.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFile } from "node:fs/promises";
import { and, eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { demoActors, demoOrganisationId } from "@/tests/support/session";
import { makeFlight, makeJob } from "@/tests/support/factories";
import { makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { describeMoment } from "@/lib/findings/describe-moment";
import { readPdfText } from "@/tests/support/read-pdf-text";

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let rec: ProcessedRecording;
let jobId: string;
const NOTE = "Mortar joint open <b>not bold</b>";

const pdfText = async (bytes: Buffer) => (await readPdfText(bytes)).text;

const videoTime = () => page.evaluate(() => (document.querySelector("[data-testid=review-video] video") as HTMLVideoElement).currentTime);
const frameText = () => page.getByTestId("frame-number").innerText();

beforeAll(async () => {
  const actors = await demoActors();
  const orgId = await demoOrganisationId();
  const job = await makeJob(orgId, { title: "Review room e2e job", reviewerId: actors.reviewer!.userId, pilotId: actors.pilot!.userId });
  jobId = job.id;
  const flight = await makeFlight(orgId, { jobId });
  rec = await makeProcessedRecording(orgId, flight, { seconds: 3, fps: 30, width: 320, height: 180, name: "TOWER0001.264" });
  browser = await launch();
  ctx = await newContext(browser);
  page = await ctx.newPage();
  await signInWithPassword(page, "reviewer@kestrelmoor.example");
});
afterAll(async () => {
  await ctx?.close();
  await browser?.close();
  await closeDb();
});

describe("review room", () => {
  it("opens the recording, plays, and steps frame by frame with the keyboard", async () => {
    await page.goto(`/recordings/${rec.recording.id}`);
    await page.getByRole("heading", { name: "TOWER0001.264" }).waitFor();
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    // play a moment so the analytics SDK starts a view
    await page.getByRole("heading", { name: "TOWER0001.264" }).click();
    await page.keyboard.press("k");
    await page.waitForTimeout(1200);
    await page.keyboard.press("k");
    await page.keyboard.press("Home");
    await expect.poll(frameText).toContain("frame 0 ");
    for (let i = 0; i < 3; i++) await page.keyboard.press(".");
    await expect.poll(frameText).toContain("frame 3 ");
    await page.keyboard.press(",");
    await expect.poll(frameText).toContain("frame 2 ");
    // the picture is really at frame 2: 2/30 s <= currentTime < 3/30 s
    await expect.poll(videoTime).toBeGreaterThanOrEqual(2 / 30);
    expect(await videoTime()).toBeLessThan(3 / 30);
    const m = describeMoment(2, { num: 30, den: 1 });
    expect(await page.getByTestId("clock-time").innerText()).toBe(m.clock); // 00:00:00.067
    expect(await page.getByTestId("smpte").innerText()).toBe(m.smpte); // 00:00:00:02
  });

  it("shows the shortcut help and a scrub thumbnail", async () => {
    await page.keyboard.press("?");
    const help = page.getByRole("dialog", { name: "Keyboard shortcuts" });
    await help.waitFor();
    expect(await help.innerText()).toContain("One frame forward");
    await page.keyboard.press("Escape");
    await help.waitFor({ state: "detached" });
    const bar = page.locator(".vjs-progress-control");
    await page.locator("video-js").hover();
    await bar.hover({ position: { x: 40, y: 5 } });
    await page.getByTestId("scrub-thumbnail").waitFor();
  });

  it("marks a finding with a box and sees its marker and its still", async () => {
    await page.keyboard.press("m");
    const form = page.getByRole("form", { name: "Mark a finding" });
    await form.waitFor();
    expect(await form.getByTestId("draft-start").innerText()).toContain("frame 2");
    await form.locator("input[name=severity][value=major]").check();
    // the categories editor checks a new category with the route's own schema before sending it
    await form.getByRole("button", { name: "Edit categories" }).click();
    const editor = page.getByRole("dialog", { name: "Finding categories" });
    await editor.getByRole("button", { name: "Add category" }).click();
    await editor.getByRole("alert").filter({ hasText: "Required" }).waitFor();
    await editor.getByLabel("New category").fill("Lichen on the parapet");
    await editor.locator("select[name=assetKind]").selectOption("tower");
    await editor.getByRole("button", { name: "Add category" }).click();
    await editor.getByLabel("Name of Lichen on the parapet").waitFor();
    expect(await editor.getByRole("alert").count()).toBe(0);
    await editor.getByRole("button", { name: "Close" }).click();
    await form.getByRole("textbox", { name: "Note" }).fill(NOTE);
    await form.getByRole("button", { name: /Draw a box/ }).click();
    const overlay = page.getByTestId("box-overlay");
    await overlay.scrollIntoViewIfNeeded();
    const box = (await overlay.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.2, box.y + box.height * 0.2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.6, { steps: 5 });
    await page.mouse.up();
    await form.getByTestId("draft-box").waitFor();
    // half a position is refused in the browser, by the route's own schema, before anything is sent
    let findingPosts = 0;
    page.on("request", (r) => void (r.method() === "POST" && r.url().endsWith("/api/findings") && findingPosts++));
    await form.getByText("Position (optional)").click();
    await form.getByLabel("Latitude").fill("54.41");
    await form.getByRole("button", { name: "Save finding" }).click();
    await form.getByText("Give both latitude and longitude, or neither").first().waitFor();
    expect(findingPosts).toBe(0);
    await form.getByLabel("Latitude").fill("");
    await form.getByRole("button", { name: "Save finding" }).click();
    await form.waitFor({ state: "detached" });

    const marker = page.locator("[data-testid=finding-marker][data-severity=major]");
    await marker.waitFor();
    expect(await marker.getAttribute("aria-label")).toContain("frame 2");
    const item = page.getByTestId("finding-item").first();
    expect(await item.getByTestId("finding-severity").innerText()).toBe("Major");
    // the note shows the characters typed, not markup
    expect(await item.getByTestId("finding-note").innerText()).toBe(NOTE);
    expect(await item.locator("b").count()).toBe(0);
    // the worker extracts the still; the list polls until it appears
    const still = item.getByTestId("finding-still");
    await still.waitFor({ timeout: 60_000 });
    await page.waitForFunction(() => {
      const img = document.querySelector("[data-testid=finding-still]") as HTMLImageElement | null;
      return !!img && img.complete && img.naturalWidth === 320;
    });
    const [row] = await db().select().from(s.findings).where(eq(s.findings.recordingId, rec.recording.id));
    expect(row).toMatchObject({ startFrame: 2, severity: "major", note: NOTE });
    expect(row.box!.x).toBeCloseTo(0.2, 1);
    expect(row.box!.w).toBeCloseTo(0.3, 1);
    // clicking the marker jumps back to the frame from elsewhere
    await page.keyboard.press("End");
    await expect.poll(frameText).toContain("frame 89 ");
    await marker.click();
    await expect.poll(frameText).toContain("frame 2 ");
    // a link to the finding (as the job's findings list gives) opens at its frame
    await page.goto(`/recordings/${rec.recording.id}?finding=${row.id}`);
    await page.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await expect.poll(frameText).toContain("frame 2 ");
    expect(await page.locator("[data-testid=finding-item][data-finding-id]").first().getAttribute("class")).toContain("border-lake");
  });

  it("stores the playback view sent by the analytics SDK to the app's collector", async () => {
    // leaving the page disposes the player, which flushes the SDK's queued beacons
    await page.goto(`/jobs/${jobId}/report`);
    await expect
      .poll(async () => (await db().select().from(s.playbackViews).where(and(eq(s.playbackViews.recordingId, rec.recording.id)))).length, { timeout: 30_000, interval: 1000 })
      .toBeGreaterThan(0);
    const [view] = await db().select().from(s.playbackViews).where(eq(s.playbackViews.recordingId, rec.recording.id));
    const actors = await demoActors();
    expect(view.viewerUserId).toBe(actors.reviewer!.userId);
  });

  it("builds the job's report with progress and downloads the PDF", async () => {
    await page.getByRole("button", { name: "Build report" }).click();
    const version = page.getByTestId("report-version").first();
    await expect.poll(async () => version.getAttribute("data-state"), { timeout: 90_000, interval: 500 }).toBe("ready");
    const [download] = await Promise.all([page.waitForEvent("download"), version.getByTestId("report-download").click()]);
    expect(download.suggestedFilename()).toBe("Inspection report - Review room e2e job - v1.pdf");
    const bytes = await readFile((await download.path())!);
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    const text = await pdfText(bytes);
    expect(text).toContain(describeMoment(2, { num: 30, den: 1 }).clock);
    expect(text).toContain("Major (FHWA NBI condition rating 4");
    expect(text.replace(/\s+/g, "")).toContain(rec.recording.sha256);
    expect(text).toContain(NOTE);
  });
});
