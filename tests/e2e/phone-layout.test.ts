// Cairn on a phone (390 x 844 CSS px, a common phone viewport) in Debian's chromium against the built
// app: no workspace page scrolls sideways (document.documentElement.scrollWidth <= innerWidth), the
// navigation folds behind one "Menu" button that works from the keyboard, and a table keeps its key
// columns while the rest opens in a row's details. Screenshots of the job and recording pages at
// 1440 x 900 and 390 x 844 go to .data/screenshots/ (not committed).
import { mkdir } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb } from "@/db/client";
import { launch, BASE } from "@/tests/support/browser";
import { DEMO_PASSWORD } from "@/db/seed/demo-scenario";
import { workspacePages, type WalkedPage } from "./workspace-pages";

const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1440, height: 900 };
const shots = path.resolve(__dirname, "../../.data/screenshots");
let browser: Browser;
let walk: Awaited<ReturnType<typeof workspacePages>>;

async function signedIn(viewport: { width: number; height: number }): Promise<{ ctx: BrowserContext; page: Page }> {
  const ctx = await browser.newContext({ baseURL: BASE, viewport, deviceScaleFactor: 1 });
  ctx.setDefaultTimeout(30_000);
  const page = await ctx.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("owner@kestrelmoor.example");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
  return { ctx, page };
}

async function settle(page: Page, p: WalkedPage) {
  await page.goto(p.path);
  await page.locator("main#main").waitFor();
  await page.waitForLoadState("networkidle").catch(() => {});
  await page.waitForTimeout(300);
}

beforeAll(async () => {
  walk = await workspacePages();
  browser = await launch();
  await mkdir(shots, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("workspace pages on a 390 px phone", () => {
  it("none scrolls sideways", async () => {
    const { ctx, page } = await signedIn(PHONE);
    const wide: string[] = [];
    for (const p of walk.pages) {
      await settle(page, p);
      const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }));
      if (scrollWidth > innerWidth) wide.push(`${p.name} (${p.path}): ${scrollWidth} px > ${innerWidth} px`);
    }
    expect(wide).toEqual([]);
    await ctx.close();
  });

  it("the navigation is one Menu button, opened and closed from the keyboard; the header stays one row", async () => {
    const { ctx, page } = await signedIn(PHONE);
    await page.goto("/jobs");
    const header = await page.locator("header").boundingBox();
    expect(header!.height).toBeLessThan(80); // one row (the wrapped navigation was 195 px)
    const menu = page.getByRole("button", { name: /^Menu/ });
    const jobsLink = page.getByRole("navigation", { name: "Workspace" }).getByRole("link", { name: "Flights" });
    expect(await menu.getAttribute("aria-expanded")).toBe("false");
    expect(await jobsLink.isVisible()).toBe(false);
    await menu.focus();
    await page.keyboard.press("Enter");
    expect(await menu.getAttribute("aria-expanded")).toBe("true");
    expect(await jobsLink.isVisible()).toBe(true);
    await page.keyboard.press("Tab"); // into the list
    await page.keyboard.press("Escape");
    expect(await menu.getAttribute("aria-expanded")).toBe("false");
    expect(await page.evaluate(() => document.activeElement?.getAttribute("data-testid"))).toBe("nav-menu-button");
    // following a link closes it
    await menu.click();
    await jobsLink.click();
    await page.waitForURL(/\/flights/);
    expect(await menu.getAttribute("aria-expanded")).toBe("false");
    await ctx.close();
  });

  it("a table keeps its key columns and shows the rest in a row's details", async () => {
    const { ctx, page } = await signedIn(PHONE);
    await page.goto(walk.jobPath);
    const table = page.getByTestId("recordings-table");
    const row = table.locator("tbody tr[data-recording-id]").first();
    await row.waitFor();
    // the name and state stay; the hash has left the row
    expect(await row.locator("td").filter({ has: page.locator("[data-hash]") }).isVisible()).toBe(false);
    const toggle = row.getByRole("button", { name: "Details" });
    expect(await toggle.getAttribute("aria-expanded")).toBe("false");
    await toggle.click();
    expect(await toggle.getAttribute("aria-expanded")).toBe("true");
    const details = page.locator(`[id="${await toggle.getAttribute("aria-controls")}"]`);
    expect(await details.getByRole("term").filter({ hasText: "SHA-256" }).isVisible()).toBe(true);
    expect(await details.locator("[data-hash]").isVisible()).toBe(true);
    // the jobs list likewise: title and status stay, the reviewer moves into the details
    await page.goto("/jobs");
    const jobRow = page.locator("tbody tr").filter({ has: page.getByRole("button", { name: "Details" }) }).first();
    await jobRow.waitFor();
    expect(await page.getByRole("columnheader", { name: "Job" }).isVisible()).toBe(true);
    expect(await page.getByRole("columnheader", { name: "Reviewer" }).isVisible()).toBe(false);
    await jobRow.getByRole("button", { name: "Details" }).click();
    expect(await page.getByRole("term").filter({ hasText: "Reviewer" }).first().isVisible()).toBe(true);
    await ctx.close();
  });

  it("screenshots of the job and recording pages at 1440 x 900 and 390 x 844", async () => {
    for (const [label, viewport] of [["1440x900", DESKTOP], ["390x844", PHONE]] as const) {
      const { ctx, page } = await signedIn(viewport);
      for (const [name, p] of [["job", walk.jobPath], ["recording", walk.recordingPath]] as const) {
        await settle(page, { name, path: p });
        await page.screenshot({ path: path.join(shots, `${name}-${label}.png`), fullPage: false });
      }
      await ctx.close();
    }
  });
});
