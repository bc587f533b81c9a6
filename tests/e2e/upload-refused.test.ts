// The upload widget and Cairn's outcome list tell one story for a refused file (Debian's chromium,
// built app): a text file named .264 and a real raw H.264 stream go up together; the stream is
// stored, the text file reads "Refused" with the server's reason, and the Uppy widget neither lists it
// as failed nor offers "Retry" for it (before, it said "Upload failed · 1 of 2 files uploaded · Retry").
// Sizes on the page are decimal (lib/uploads/format-bytes.ts): no KiB, no Uppy "KB".
import { mkdir, rm, writeFile, copyFile, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { closeDb } from "@/db/client";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { actorByEmail } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeRawH264 } from "@/tests/support/media/make-upload-fixtures";
import { formatBytes } from "@/lib/uploads/format-bytes";

let browser: Browser;
const dir = path.join(os.tmpdir(), `cairn-e2e-refused-${process.pid}`);

beforeAll(async () => {
  browser = await launch();
  await mkdir(dir, { recursive: true });
  await writeFile(path.join(dir, "battery-log.264"), "battery 1: 41 % at landing\nbattery 2: 38 %\n");
  await copyFile(await makeRawH264({ seconds: 2, width: 320, height: 240, fps: 30, bitrate: 400, profile: "baseline", pattern: "testsrc2" }), path.join(dir, "REC_0007.264"));
});
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
  await closeDb();
});

describe("a refused file in the uploader", () => {
  it("reads refused in Cairn's list and is not offered for retry by the widget", async () => {
    const pilot = await actorByEmail("pilot@kestrelmoor.example");
    const flight = await makeFlight(pilot.organisationId, { aircraft: "E2E refusal quad" });
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInWithPassword(page, "pilot@kestrelmoor.example");
    await page.goto(`/upload?jobId=${flight.jobId}&flightId=${flight.id}`);
    await page.getByRole("heading", { name: "2. Add the files" }).waitFor();
    await page
      .locator(".uppy-Dashboard input.uppy-Dashboard-input:not([webkitdirectory])")
      .first()
      .setInputFiles([path.join(dir, "battery-log.264"), path.join(dir, "REC_0007.264")]);

    const refused = page.locator('[data-upload-file="battery-log.264"]');
    const stored = page.locator('[data-upload-file="REC_0007.264"]');
    await expect.poll(() => refused.getAttribute("data-upload-state"), { timeout: 60_000 }).toBe("refused");
    await expect.poll(() => stored.getAttribute("data-upload-state"), { timeout: 60_000 }).toBe("stored");
    const line = (await refused.textContent()) ?? "";
    expect(line).toContain("Refused");
    expect(line).toContain("it is text, not a recording");
    expect(line).not.toMatch(/retry/i);

    // the widget: the refused file is gone from its list, the stored one completed, no failure, no Retry
    await expect.poll(() => page.locator(".uppy-Dashboard-Item").count(), { timeout: 15_000 }).toBe(1);
    expect(await page.locator(".uppy-Dashboard-Item").first().getAttribute("id")).toContain("rec/0007");
    const bar = (await page.locator(".uppy-StatusBar").textContent()) ?? "";
    expect(bar).not.toMatch(/failed/i);
    expect(await page.getByRole("button", { name: /^Retry/ }).count()).toBe(0);
    // the session's summary counts one stored and one refused
    expect(await page.getByText(/2 files · 1 stored · 0 already held · 1 refused/).count()).toBe(1);

    // one unit system: the outcome list gives the stored file's size in decimal units, nothing binary
    const size = (await stat(path.join(dir, "REC_0007.264"))).size;
    expect(await stored.textContent()).toContain(formatBytes(size));
    const text = (await page.locator("main").textContent()) ?? "";
    expect(text).not.toMatch(/\d\s?(KiB|MiB|GiB|KB)\b/);
    await ctx.close();
  });
});
