// Accessibility in Debian's chromium against the built app: axe-core (its own source, from
// node_modules, injected with page.addScriptTag; nothing fetched) over every workspace page in the
// daylight and dim themes, and over the share pages, must find no violation of impact "serious" or
// "critical" (axe-core's impact scale; its rules follow WCAG 2.2, e.g. 1.4.3 contrast, 4.1.2 name,
// role, value). The context bypasses the pages' Content-Security-Policy only so the test can add
// axe's script; the app's own scripts run as they always do.
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb } from "@/db/client";
import { launch, BASE } from "@/tests/support/browser";
import { DEMO_PASSWORD } from "@/db/seed/demo-scenario";
import { workspacePages } from "./workspace-pages";

type AxeViolation = { id: string; impact: string | null; help: string; nodes: { target: string[]; failureSummary?: string }[] };

let browser: Browser;
let axeSource = "";
let walk: Awaited<ReturnType<typeof workspacePages>>;

async function context(theme: "light" | "dark"): Promise<BrowserContext> {
  const ctx = await browser.newContext({ baseURL: BASE, viewport: { width: 1280, height: 900 }, bypassCSP: true });
  ctx.setDefaultTimeout(30_000);
  // the dim theme is the stored choice the shell reads (components/shell/workspace-shell.tsx)
  await ctx.addInitScript((t) => localStorage.setItem("cairn-theme", t), theme);
  return ctx;
}

async function signIn(page: Page) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("owner@kestrelmoor.example");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

/** Serious and critical violations on the page as it stands, one line each. */
async function seriousViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ content: axeSource });
  const violations = (await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: unknown[] }> } }).axe;
    return (await axe.run(document, { resultTypes: ["violations"] })).violations;
  })) as AxeViolation[];
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.impact} ${v.id} (${v.help}): ${v.nodes.slice(0, 3).map((n) => n.target.join(" ")).join(" | ")}`);
}

async function settle(page: Page, path: string) {
  await page.goto(path);
  await page.waitForLoadState("networkidle").catch(() => {});
  await page.waitForTimeout(500);
}

beforeAll(async () => {
  axeSource = await readFile(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");
  walk = await workspacePages();
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("axe-core finds nothing serious or critical", () => {
  for (const theme of ["light", "dark"] as const) {
    it(`on every workspace page, ${theme === "dark" ? "dim" : "daylight"} theme`, async () => {
      const ctx = await context(theme);
      const page = await ctx.newPage();
      await signIn(page);
      const found: string[] = [];
      let checked = 0;
      for (const p of walk.pages) {
        await settle(page, p.path);
        await page.locator("main#main").waitFor();
        expect(await page.evaluate(() => document.documentElement.classList.contains("dark"))).toBe(theme === "dark");
        for (const v of await seriousViolations(page)) found.push(`${p.name}: ${v}`);
        checked++;
      }
      expect(checked).toBe(walk.pages.length);
      expect(found).toEqual([]);
      await ctx.close();
    });
  }

  it("on the share pages (no account)", async () => {
    const ctx = await context("light");
    const page = await ctx.newPage();
    await settle(page, walk.sharePath);
    expect(page.url()).toContain("/s/");
    const found = (await seriousViolations(page)).map((v) => `share view: ${v}`);
    // an unknown token's page
    await settle(page, "/s/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA");
    found.push(...(await seriousViolations(page)).map((v) => `share not found: ${v}`));
    expect(found).toEqual([]);
    await ctx.close();
  });

  it("is able to fail: a low-contrast button added to a page is reported", async () => {
    const ctx = await context("light");
    const page = await ctx.newPage();
    await signIn(page);
    await settle(page, "/jobs");
    await page.evaluate(() => {
      const b = document.createElement("button");
      b.textContent = "Faint";
      b.style.cssText = "color:#ffffff;background:#4fb3bf"; // the old dim-theme pair, 2.46:1
      document.querySelector("main")!.append(b);
    });
    expect((await seriousViolations(page)).some((v) => v.includes("color-contrast"))).toBe(true);
    await ctx.close();
  });
});
