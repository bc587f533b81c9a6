// Flight tracks in a real browser against the built app: import a CSV track on a flight's page, align it by
// matching the player's frame to a track point, play the recording and see the aircraft move on the plan,
// and log a link event of the signal trace as a range check with one click, nothing typed; and a track
// dropped in the uploader together with a recording.
// The recording is real: a frame-counter stream damaged in Node (a scrambled picture, a run of lost ones),
// processed by the worker's own handler (tests/support/media/make-processed-recording.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { demoOrganisationId } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeCounterH264, makeProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { makeDamagedH264 } from "@/tests/support/media/make-damaged-h264";

const T0 = Date.UTC(2026, 2, 14, 10, 0, 0);
const LAUNCH = { lat: 54.41301, lon: -2.61955 }; // the invented demo launch point (db/seed/demo-scenario.ts)
const TRACK_AHEAD_MS = 2_500; // the track's clock runs this far ahead of the recorder's
const FPS = 30;

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let flightId: string;
let orgId: string;

/** 10 Hz for 40 s: on the ground until 5 s, then north at 3 m/s, climbing 2 m/s to 40 m. */
function trackCsv(): string {
  const rows = ["time,lat,lon,height_m"];
  for (let i = 0; i <= 400; i++) {
    const sec = i / 10;
    const north = Math.max(0, sec - 5) * 3;
    rows.push(`${new Date(T0 + i * 100).toISOString()},${(LAUNCH.lat + north / 111_300).toFixed(8)},${LAUNCH.lon},${Math.min(40, Math.max(0, sec - 5) * 2).toFixed(1)}`);
  }
  return rows.join("\n") + "\n";
}

beforeAll(async () => {
  orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat, launchLongitude: LAUNCH.lon, aircraft: "Track test quad" });
  flightId = flight.id;
  const clean = await makeCounterH264({ seconds: 6, fps: FPS, gop: 15 });
  // picture 40 scrambled (breaking up), 61-74 never arrive (lost), back at the IDR at 75
  const damaged = await makeDamagedH264(clean, { remove: Array.from({ length: 14 }, (_, i) => 61 + i), scramble: [40] }, "e2e-flight-track");
  const { recording } = await makeProcessedRecording(orgId, flight, { source: damaged, name: "TRACK0001.264", seconds: 6, fps: FPS });
  // closed at 10:00:10 on the recorder's clock: it started at 10:00:04 (recorder), 10:00:06.5 on the track's
  await db().update(s.recordings).set({ recorderModifiedAt: new Date(T0 + 10_000) }).where(eq(s.recordings.id, recording.id));
  browser = await launch();
  ctx = await newContext(browser);
  page = await ctx.newPage();
  await signInWithPassword(page, "pilot@kestrelmoor.example");
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

const aircraftNorth = async () => Number(await page.getByTestId("track-aircraft").getAttribute("data-north"));

describe("a flight track in the browser", () => {
  it("imports a track, aligns it, moves the aircraft with the player, and logs a range check in one click", async () => {
    await page.goto(`/flights/${flightId}`);
    await page.getByTestId("track-empty").waitFor();

    // a bad file first: refused with its name, line and reason, and nothing saved
    await page.getByTestId("track-file").setInputFiles({ name: "speeds.csv", mimeType: "text/csv", buffer: Buffer.from("time,lat,lon,speed\n2026-03-14T10:00:00Z,54.4,-2.6,3\n") });
    await expect.poll(() => page.getByTestId("track-problems").textContent()).toMatch(/speeds\.csv, line 1: the column "speed" is not one Cairn reads/);
    expect(await db().$count(s.flightTracks, eq(s.flightTracks.flightId, flightId))).toBe(0);

    await page.getByTestId("track-file").setInputFiles({ name: "flight-log.csv", mimeType: "text/csv", buffer: Buffer.from(trackCsv()) });
    await page.getByTestId("track-loaded").waitFor();
    expect(await page.getByTestId("track-name").textContent()).toBe("flight-log.csv");
    // the proposal from file times: rough, said so
    await expect.poll(() => page.getByTestId("alignment-sureness").textContent()).toMatch(/^Rough/);

    // match frame 0 of the recording with the track point at 10:00:06.5 (point 66 of the 10 Hz track)
    await page.getByTestId("align-frame").fill("0");
    await page.getByTestId("align-point").fill("66");
    await page.getByTestId("align-set").click();
    await expect.poll(() => page.getByTestId("alignment-sureness").textContent()).toMatch(/^Matched by the pilot/);
    expect(await page.getByTestId("alignment-offset").textContent()).toBe(`+ ${(TRACK_AHEAD_MS / 1000).toFixed(3)} s`);
    const [stored] = await db().select().from(s.trackAlignments).where(eq(s.trackAlignments.organisationId, orgId)).orderBy(s.trackAlignments.createdAt);
    expect(stored).toBeTruthy();

    // play: the aircraft moves north on the plan as the recording plays
    await page.getByTestId("track-video").waitFor();
    await page.evaluate(() => {
      const v = document.querySelector("[data-testid=track-video]") as HTMLVideoElement;
      v.muted = true;
      v.currentTime = 0.5;
    });
    await page.getByTestId("track-aircraft").waitFor();
    const before = await aircraftNorth();
    await page.evaluate(() => void (document.querySelector("[data-testid=track-video]") as HTMLVideoElement).play());
    await expect.poll(aircraftNorth, { timeout: 15_000 }).toBeGreaterThan(before + 1);
    await expect.poll(() => page.getByTestId("readout-distance").textContent()).toMatch(/ (ft|m)$/);
    await page.evaluate(() => (document.querySelector("[data-testid=track-video]") as HTMLVideoElement).pause());

    // one click: the first link event becomes a range check with nothing typed
    const rows = page.getByTestId("track-event-row");
    expect(await rows.count()).toBeGreaterThanOrEqual(2);
    await page.getByTestId("log-range-check").first().click();
    await expect.poll(() => page.getByTestId("track-message").textContent()).toBe("Range check logged from the track.");
    await expect.poll(() => page.getByRole("link", { name: "Logged" }).count()).toBe(1);
    const checks = await db().select().from(s.rangeChecks).where(and(eq(s.rangeChecks.organisationId, orgId), eq(s.rangeChecks.flightId, flightId)));
    expect(checks).toHaveLength(1);
    expect(checks[0].notes).toMatch(/^Measured from the flight track “flight-log\.csv”/);
    expect(checks[0].event).toBe("first_degradation");
    // the cautions stand beside the figures, never a modal
    expect(await page.getByText("Range figures describe the radio link, not permission to fly that far.").count()).toBeGreaterThanOrEqual(1);
    expect(await page.getByRole("dialog").count()).toBe(0);
  }, 120_000);

  it("imports a track dropped with the recordings in the uploader, and uploads the recording beside it", async () => {
    const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat, launchLongitude: LAUNCH.lon });
    await page.goto(`/upload?jobId=${flight.jobId}&flightId=${flight.id}`);
    await page.getByRole("heading", { name: "2. Add the files" }).waitFor();
    const clean = await makeCounterH264({ seconds: 1, fps: FPS });
    await page.locator(".uppy-Dashboard input.uppy-Dashboard-input:not([webkitdirectory])").first().setInputFiles([
      { name: "flight-log.csv", mimeType: "text/csv", buffer: Buffer.from(trackCsv()) },
      { name: "VID_0100.h264", mimeType: "video/h264", buffer: await import("node:fs/promises").then((fs) => fs.readFile(clean)) },
    ]);
    await expect.poll(() => page.locator('[data-upload-file="flight-log.csv"]').getAttribute("data-upload-state"), { timeout: 30_000 }).toBe("track");
    await expect.poll(() => page.locator('[data-upload-file="VID_0100.h264"]').getAttribute("data-upload-state"), { timeout: 60_000 }).toBe("stored");
    expect(await page.locator('[data-upload-file="flight-log.csv"]').textContent()).toMatch(/Imported as the flight's track \(401 points\)/);
    const [track] = await db().select({ name: s.flightTracks.originalName, n: s.flightTracks.pointCount }).from(s.flightTracks).where(eq(s.flightTracks.flightId, flight.id));
    expect(track).toEqual({ name: "flight-log.csv", n: 401 });
    // the track file never went to the recordings' upload path
    expect(await db().$count(s.recordings, and(eq(s.recordings.flightId, flight.id), eq(s.recordings.originalName, "flight-log.csv")))).toBe(0);
  }, 120_000);
});
