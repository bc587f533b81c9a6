// Debian's chromium driven by playwright-core; never a downloaded browser (docs/library-notes.md).
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { E2E_PORT } from "./test-env";
import { DEMO_PASSWORD } from "@/db/seed/demo-scenario";

export const BASE = `http://localhost:${E2E_PORT}`;

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

export async function newContext(browser: Browser): Promise<BrowserContext> {
  const ctx = await browser.newContext({ baseURL: BASE, viewport: { width: 1280, height: 900 }, acceptDownloads: true });
  ctx.setDefaultTimeout(20_000);
  return ctx;
}

export async function signInWithPassword(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/today/);
}
