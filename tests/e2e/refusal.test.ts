// Refusals in a real browser (Debian chromium) against the built app: a page outside the role, another
// organisation's record, a record that never existed and an unknown address all answer 404 with the
// same styled page, inside the workspace frame (navigation kept), with the way back; the words are
// identical for "does not exist" and "not yours", so the answer reveals nothing.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { OTHER_USER } from "@/db/seed/demo-scenario";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";

let browser: Browser;
const NOWHERE = "00000000-0000-4000-8000-000000000000";

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

async function as(email: string): Promise<{ ctx: BrowserContext; page: Page; errors: string[] }> {
  const ctx = await newContext(browser);
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(e.message));
  await signInWithPassword(page, email);
  return { ctx, page, errors };
}

/** Opens the address; returns the status and the refusal's words (null when no refusal is shown). */
async function refusalAt(page: Page, url: string): Promise<{ status: number; words: string | null; framed: boolean }> {
  const res = await page.goto(url);
  const refusal = page.getByTestId("refusal");
  const shown = (await refusal.count()) === 1;
  return {
    status: res!.status(),
    words: shown ? (await refusal.innerText()).trim() : null,
    // inside the workspace frame: the signed-in header with the user menu is still there
    framed: (await page.getByTestId("user-menu").count()) === 1,
  };
}

describe("the refusal page", () => {
  it("a role outside a page: styled, inside the frame, with the way back to Today", async () => {
    const { ctx, page, errors } = await as("pilot@kestrelmoor.example");
    const members = await refusalAt(page, "/members");
    expect(members.status).toBe(404);
    expect(members.framed).toBe(true);
    expect(members.words).toContain("Not found, or not open to you");
    expect(members.words).not.toContain("This page could not be found");
    // the same words for a page of another kind the role may not use
    const client = await as("client@kestrelmoor.example");
    const range = await refusalAt(client.page, "/range");
    expect(range).toEqual({ ...members, words: members.words });
    await client.ctx.close();
    // the way back
    await page.getByTestId("refusal").getByRole("link", { name: "Go to Today" }).click();
    await page.waitForURL(/\/today$/);
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    expect(errors).toEqual([]);
    await ctx.close();
  });

  it("another organisation's record reads exactly like one that never existed, and like an unknown address", async () => {
    const [job] = await db().select({ id: s.jobs.id }).from(s.jobs).where(eq(s.jobs.title, "Valve tower annual inspection"));
    const [rec] = await db().select({ id: s.recordings.id }).from(s.recordings).where(eq(s.recordings.jobId, job.id)).limit(1);
    const { ctx, page, errors } = await as(OTHER_USER.email);
    const theirs = await refusalAt(page, `/jobs/${job.id}`);
    const never = await refusalAt(page, `/jobs/${NOWHERE}`);
    const garbled = await refusalAt(page, `/jobs/not-a-job`);
    const unknown = await refusalAt(page, `/no-such-page-here`);
    for (const r of [theirs, never, garbled, unknown]) {
      expect(r.status).toBe(404);
      expect(r.words).toBe(theirs.words);
    }
    expect(theirs.framed).toBe(true);
    if (rec) {
      const recording = await refusalAt(page, `/recordings/${rec.id}`);
      expect(recording).toEqual(theirs);
      expect(await refusalAt(page, `/custody/recordings/${rec.id}`)).toEqual(theirs);
    }
    expect(await refusalAt(page, `/custody/jobs/${job.id}`)).toEqual(theirs);
    // nothing of the record leaks into the page
    expect(await page.content()).not.toContain("Valve tower");
    expect(errors).toEqual([]);
    await ctx.close();
  });
});
