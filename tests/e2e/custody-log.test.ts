// The custody log in a real browser (Debian chromium) against the built app: a job's log opens from
// the job page's link (the job page no longer holds the log), newest first, 50 events a page with
// older pages behind a button, filters by kind of event, person and recording, plain names for every
// derived file (never "thumbnails_vtt" or "sprite"), and the legal hold: set with a reason, released
// only with a reason and a confirmation, both in the log.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { recordCustodyEvent, type CustodyInput } from "@/lib/custody/record-custody-event";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { demoActors, demoOrganisationId, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeStoredRecording } from "@/tests/integration/sharing/share-fixtures";

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let jobId: string;
let recA: string;
let recB: string;
const errors: string[] = [];
const VIEWS = 60;
const KINDS = ["playable", "poster", "sprite", "thumbnails_vtt"] as const;

const rows = () => page.getByTestId("custody-table").locator("tbody tr[data-event-type]");
const seqs = () => rows().evaluateAll((trs) => trs.map((tr) => Number(tr.getAttribute("data-seq"))));
const countText = () => page.getByTestId("custody-count").textContent();

beforeAll(async () => {
  browser = await launch();
  actors = await demoActors();
  orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  jobId = flight.jobId;
  recA = (await makeStoredRecording(orgId, jobId, flight.id, { name: "east-face-pass.264" })).id;
  recB = (await makeStoredRecording(orgId, jobId, flight.id, { name: "west-face-pass.264", sequenceIndex: 1 })).id;
  const ev = (e: Omit<CustodyInput, "organisationId" | "jobId">) => recordCustodyEvent({ organisationId: orgId, jobId, ...e });
  for (const id of [recA, recB]) {
    await ev({ eventType: "upload", evidenceType: "recording", evidenceId: id, actor: { userId: actors.pilot!.userId, role: "pilot" } });
    for (const kind of KINDS) await ev({ eventType: "derived", evidenceType: "rendition", evidenceId: randomUUID(), purpose: kind, details: { recordingId: id, kind } });
  }
  for (let i = 0; i < VIEWS; i++) await ev({ eventType: "view", evidenceType: "recording", evidenceId: i % 2 ? recA : recB, actor: { userId: actors.reviewer!.userId, role: "reviewer" } });
  for (let i = 0; i < 3; i++) await ev({ eventType: "download", evidenceType: "recording", evidenceId: recA, actor: { userId: actors.owner!.userId, role: "owner" } });

  ctx = await newContext(browser);
  page = await ctx.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  await signInWithPassword(page, "owner@kestrelmoor.example");
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("a job's custody log", () => {
  it("is linked from the job page, not embedded there", async () => {
    await page.goto(`/jobs/${jobId}`);
    const link = page.getByTestId("custody-log-link");
    await expect.poll(() => link.textContent(), { timeout: 15_000 }).toContain(`${2 + 2 * KINDS.length + VIEWS + 3} events`);
    expect(await page.getByTestId("custody-table").count()).toBe(0);
    await link.getByRole("link").click();
    await page.waitForURL(new RegExp(`/custody/jobs/${jobId}$`));
  });

  it("shows the newest 50 first; older pages follow without repeating an event", async () => {
    await rows().first().waitFor();
    const total = 2 + 2 * KINDS.length + VIEWS + 3;
    await expect.poll(countText).toBe(`Events 1–50 of ${total}`);
    const first = await seqs();
    expect(first).toHaveLength(50);
    for (let i = 1; i < first.length; i++) expect(first[i]).toBeLessThan(first[i - 1]);
    expect(await rows().first().getAttribute("data-event-type")).toBe("download");
    await page.getByRole("button", { name: "Older events →" }).click();
    await expect.poll(countText).toBe(`Events 51–${total} of ${total}`);
    const second = await seqs();
    expect(second).toHaveLength(total - 50);
    expect(Math.max(...second)).toBeLessThan(Math.min(...first));
    expect(await page.getByRole("button", { name: "Older events →" }).isDisabled()).toBe(true);
    await page.getByRole("button", { name: "← Newer events" }).click();
    await expect.poll(countText).toBe(`Events 1–50 of ${total}`);
  });

  it("names every derived file in words, never by its internal kind", async () => {
    await page.getByLabel("Kind of event").selectOption({ label: "Derived file made" });
    await expect.poll(countText).toBe(`Events 1–${2 * KINDS.length} of ${2 * KINDS.length}`);
    const text = (await page.getByTestId("custody-table").textContent())!;
    for (const word of ["Thumbnail timing track of “east-face-pass.264”", "Thumbnail picture sheet of “west-face-pass.264”", "Playable copy", "Poster picture"]) expect(text).toContain(word);
    for (const internal of ["thumbnails_vtt", "sprite", "rendition "]) expect(text).not.toContain(internal);
    // the filter is in the address, so the filtered log can be linked to
    expect(new URL(page.url()).searchParams.get("eventType")).toBe("derived");
  });

  it("filters by person and by recording, and clears", async () => {
    await page.getByRole("button", { name: "Clear filters" }).click();
    await page.getByLabel("Person").selectOption({ label: "Cleo Marchbank (reviewer)" });
    await expect.poll(countText).toBe(`Events 1–50 of ${VIEWS}`);
    expect(new Set(await rows().evaluateAll((trs) => trs.map((tr) => tr.getAttribute("data-event-type"))))).toEqual(new Set(["view"]));
    // a select inside its label: its name also carries the chosen option
    await page.getByRole("combobox", { name: /^Recording/ }).selectOption(recA);
    await expect.poll(countText).toBe(`Events 1–${VIEWS / 2} of ${VIEWS / 2}`);
    await page.getByLabel("Person").selectOption({ label: "Anyone" });
    await expect.poll(countText).toBe(`Events 1–${1 + KINDS.length + VIEWS / 2 + 3} of ${1 + KINDS.length + VIEWS / 2 + 3}`);
    await page.getByLabel("Order").selectOption("oldest");
    await expect.poll(async () => rows().first().getAttribute("data-event-type")).toBe("upload");
    await page.getByRole("button", { name: "Clear filters" }).click();
    await page.getByLabel("Order").selectOption("newest");
  });

  it("the legal hold is set with a reason and released only with a reason and a confirmation; both are in the log", async () => {
    await page.goto(`/custody/jobs/${jobId}`);
    // the log has loaded, so the page's script runs (a click before that would post the form natively)
    await expect.poll(countText, { timeout: 20_000 }).toMatch(/^Events 1–50 of/);
    const hold = page.getByTestId("legal-hold");
    await hold.getByLabel("Reason for the hold").fill("Claim KM-2026-031 (invented)");
    await hold.getByRole("button", { name: "Set legal hold" }).click();
    await expect.poll(() => hold.textContent()).toContain("Under legal hold: Claim KM-2026-031 (invented)");

    await hold.getByRole("button", { name: "Release hold…" }).click();
    const dialog = page.getByRole("dialog", { name: "Release the legal hold" });
    await dialog.getByRole("button", { name: "Release the hold" }).click();
    await dialog.getByText("Say why the hold is released").first().waitFor();
    await dialog.getByText("Tick this to confirm the release").waitFor();
    await dialog.getByLabel("Why is the hold released?").fill("Claim settled, letter of 2026-11-30 (invented)");
    await dialog.getByRole("button", { name: "Release the hold" }).click();
    await dialog.getByText("Tick this to confirm the release").waitFor();
    const [{ legalHold: stillHeld }] = await db().select({ legalHold: s.jobs.legalHold }).from(s.jobs).where(eq(s.jobs.id, jobId));
    expect(stillHeld).toBe(true);
    await dialog.getByRole("checkbox").check();
    await dialog.getByRole("button", { name: "Release the hold" }).click();
    await dialog.waitFor({ state: "detached" });
    await expect.poll(() => hold.textContent()).toContain("Not under legal hold");

    await page.getByLabel("Kind of event").selectOption({ label: "Legal hold released" });
    await expect.poll(countText).toBe("Events 1–1 of 1");
    expect(await rows().first().textContent()).toContain("Legal hold released: Claim settled, letter of 2026-11-30 (invented)");
    await page.getByLabel("Kind of event").selectOption({ label: "Legal hold set" });
    await expect.poll(countText).toBe("Events 1–1 of 1");
    expect(await rows().first().textContent()).toContain("Legal hold: Claim KM-2026-031 (invented)");
    expect(errors).toEqual([]);
  });
});

describe("a log longer than the count goes (lib/api/keyset.ts COUNT_CAP: 1,000)", () => {
  it("says 'at least 1,000' on the job page's link and in the log, and still pages on", async () => {
    const flight = await makeFlight(orgId);
    const rec = (await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "long-log-pass.264" })).id;
    for (let i = 0; i < 1001; i++)
      await recordCustodyEvent({ organisationId: orgId, jobId: flight.jobId, eventType: "view", evidenceType: "recording", evidenceId: rec, actor: { userId: actors.reviewer!.userId, role: "reviewer" } });
    await page.goto(`/jobs/${flight.jobId}`);
    await expect.poll(() => page.getByTestId("custody-log-link").textContent(), { timeout: 15_000 }).toContain("at least 1,000 events; the newest:");
    await page.goto(`/custody/jobs/${flight.jobId}`);
    await expect.poll(countText, { timeout: 15_000 }).toBe("Events 1–50 of at least 1,000");
    await page.getByRole("button", { name: "Older events →" }).click();
    await expect.poll(countText).toBe("Events 51–100 of at least 1,000");
    expect(errors).toEqual([]);
  }, 120_000);
});
