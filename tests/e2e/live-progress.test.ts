// A recording being processed shows its progress live on its page, from the progress route's
// server-sent events (app/api/recordings/[id]/progress/route.ts), with no reload: the figure follows
// what the worker writes, the page is not polled, and it turns to the outcome by itself when
// processing ends.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { demoOrganisationId } from "@/tests/support/session";
import { makeFlight, makeRecording } from "@/tests/support/factories";

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let recordingId: string;

beforeAll(async () => {
  const orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  recordingId = (await makeRecording(orgId, flight, { originalName: "LIVE0001.264", state: "processing", progress: 12 })).id;
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

const setRow = (v: Partial<typeof s.recordings.$inferInsert>) => db().update(s.recordings).set(v).where(eq(s.recordings.id, recordingId));

describe("live processing progress", () => {
  it("follows the worker's figure without a reload and shows the outcome when it ends", async () => {
    // what the page asks the server while it waits: the event stream, and any re-render of the page
    let streams = 0;
    let pageRefetches = 0;
    page.on("request", (r) => {
      if (r.url().endsWith(`/api/recordings/${recordingId}/progress`)) streams++;
      // a refresh of this page (a prefetch of a link is not one)
      else if (r.headers()["rsc"] === "1" && !r.headers()["next-router-prefetch"] && new URL(r.url()).pathname === `/recordings/${recordingId}`) pageRefetches++;
    });
    await page.goto(`/recordings/${recordingId}`);
    await page.getByText("Processing 12 %").waitFor();
    // a marker on the window: a reload or navigation would drop it
    await page.evaluate(() => ((window as unknown as { __sameDocument: boolean }).__sameDocument = true));
    const bar = page.getByRole("progressbar", { name: "Processing" });
    await setRow({ progress: 57 });
    await page.getByText("Processing 57 %").waitFor();
    expect(await bar.getAttribute("aria-valuenow")).toBe("57");
    // no polling: over four seconds the page is not fetched again, and one stream carries the changes
    await page.waitForTimeout(4000);
    expect(pageRefetches).toBe(0);
    expect(streams).toBe(1);
    await setRow({ state: "failed", failureReason: "the stream holds no picture" });
    await page.getByText("Failed: the stream holds no picture").waitFor();
    // at the end the page refreshes once (so the counter above does see refreshes: the old page,
    // which refreshed every 3 s, fails the "no polling" check)
    await expect.poll(() => pageRefetches).toBe(1);
    expect(await page.evaluate(() => (window as unknown as { __sameDocument?: boolean }).__sameDocument)).toBe(true);
  });
});
