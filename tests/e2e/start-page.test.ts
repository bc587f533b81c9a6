// The start page in a real browser (Debian chromium) against the built app: each role lands on it after
// signing in and sees the groups its role may see; an item is one click from where it is handled; a
// number changes without a reload when the work changes; the client account sees only its own
// clients' recordings. Screenshots at 1440x900 and 390x844 go to .data/screenshots/ (not committed).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_USERS } from "@/db/seed/demo-scenario";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { demoOrganisationId } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeStoredRecording } from "@/tests/integration/sharing/share-fixtures";

let browser: Browser;
let orgId: string;
const shots = path.resolve(__dirname, "../../.data/screenshots");
const email = (role: string) => DEMO_USERS.find((u) => u.role === role)!.email;

beforeAll(async () => {
  browser = await launch();
  orgId = await demoOrganisationId();
  mkdirSync(shots, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

async function signedIn(role: string, viewport = { width: 1440, height: 900 }): Promise<{ ctx: BrowserContext; page: Page; errors: string[] }> {
  const ctx = await newContext(browser);
  const page = await ctx.newPage();
  await page.setViewportSize(viewport);
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(e.message));
  await signInWithPassword(page, email(role));
  await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
  // the loading state carries the heading too: wait for the first card
  await page.locator('section[data-testid^="attention-"]').first().waitFor();
  return { ctx, page, errors };
}

const countOf = async (page: Page, kind: string) => Number((await page.getByTestId(`attention-${kind}`).getByTestId("attention-count").textContent())!.replace(/,/g, ""));

describe("the start page", () => {
  it.each([
    ["owner", ["recordings_failed", "reports_awaiting_approval", "findings_unreported", "shares_expiring", "flights_without_recording", "recordings_processing"]],
    ["pilot", ["recordings_failed", "flights_without_recording", "recordings_processing"]],
    ["reviewer", ["recordings_failed", "findings_unreported", "recordings_processing"]],
    ["client", ["recordings_failed", "recordings_processing"]],
  ])("%s lands on it after signing in and sees its own groups", async (role, kinds) => {
    const { ctx, page, errors } = await signedIn(role);
    expect(new URL(page.url()).pathname).toBe("/today");
    const shown = await page.locator('section[data-testid^="attention-"]').evaluateAll((els) => els.map((e) => e.getAttribute("data-testid")));
    expect(shown.sort()).toEqual(kinds.map((k) => `attention-${k}`).sort());
    // the navigation marks Today as the current page
    expect(await page.getByRole("navigation", { name: "Workspace" }).getByRole("link", { name: "Today" }).getAttribute("aria-current")).toBe("page");
    expect(errors).toEqual([]);
    await ctx.close();
  });

  it("a number changes without a reload, and the new item is one click from its page", async () => {
    const { ctx, page, errors } = await signedIn("owner");
    const before = await countOf(page, "recordings_failed");
    const flight = await makeFlight(orgId);
    const rec = await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "start-page-failed.264" });
    await db().update(s.recordings).set({ state: "failed", failureReason: "no video track", updatedAt: new Date() }).where(eq(s.recordings.id, rec.id));
    // the page polls every 15 s: no reload here
    await expect.poll(() => countOf(page, "recordings_failed"), { timeout: 40_000, interval: 1000 }).toBe(before + 1);
    const item = page.getByTestId("attention-recordings_failed").getByRole("link", { name: /start-page-failed\.264/ });
    expect(await item.textContent()).toContain("Failed: no video track");
    await item.click();
    await page.waitForURL(new RegExp(`/recordings/${rec.id}$`));
    expect(errors).toEqual([]);
    await ctx.close();
  });

  it("the client account does not see another customer's failed recording; the crew does", async () => {
    const flight = await makeFlight(orgId); // a fresh client the demo client account is not tied to
    const rec = await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "other-customer-failed.264" });
    await db().update(s.recordings).set({ state: "failed", failureReason: "no video track", updatedAt: new Date(Date.now() + 60_000) }).where(eq(s.recordings.id, rec.id));
    const client = await signedIn("client");
    expect(await client.page.getByText("other-customer-failed.264").count()).toBe(0);
    await client.ctx.close();
    const reviewer = await signedIn("reviewer");
    expect(await reviewer.page.getByTestId("attention-recordings_failed").getByText("other-customer-failed.264").count()).toBe(1);
    await reviewer.ctx.close();
  });

  it("screenshots at 1440x900 and 390x844, in daylight and dim, without sideways scrolling on the phone", async () => {
    for (const [name, viewport] of [
      ["desktop-1440x900", { width: 1440, height: 900 }],
      ["phone-390x844", { width: 390, height: 844 }],
    ] as const) {
      const { ctx, page, errors } = await signedIn("owner", viewport);
      await page.screenshot({ path: path.join(shots, `start-page-${name}.png`), fullPage: false });
      await page.screenshot({ path: path.join(shots, `start-page-${name}-full.png`), fullPage: true });
      const sideways = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      if (viewport.width === 390) expect(sideways).toBeLessThanOrEqual(0);
      await page.evaluate(() => localStorage.setItem("cairn-theme", "dark"));
      await page.reload();
      await page.locator('section[data-testid^="attention-"]').first().waitFor();
      await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains("dark"))).toBe(true);
      await page.screenshot({ path: path.join(shots, `start-page-${name}-dim.png`), fullPage: false });
      expect(errors).toEqual([]);
      await ctx.close();
    }
  });
});
