// Evidence packages and disposal in a real browser (Debian chromium) against the built app and the real
// worker: an owner builds a job's package from the job page and sees it reach "Ready to download" with
// its SHA-256, downloads it (the bytes' SHA-256 by Node's crypto); on the Disposal page a due job shows
// its dates, a final package is built, and the disposal needs the title typed out, after which the job
// leaves the list and its originals are gone. A pilot sees packages but cannot build one. axe-core
// (WCAG 2.2 rules) finds nothing serious or critical on the job page's section and the disposal page.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { readFile, stat } from "node:fs/promises";
import { createRequire } from "node:module";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { diskPath } from "@/tests/support/stored-files";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { BASE, launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { demoOrganisationId } from "@/tests/support/session";
import { makeSharedJob, makeStoredRecording } from "@/tests/integration/sharing/share-fixtures";
import { makeFlight } from "@/tests/support/factories";

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let orgId: string;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let due: Awaited<ReturnType<typeof makeSharedJob>> & { title: string };
const errors: string[] = [];

beforeAll(async () => {
  browser = await launch();
  orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  const made = await makeSharedJob(orgId);
  const [j] = await db().select({ title: s.jobs.title, siteId: s.jobs.siteId }).from(s.jobs).where(eq(s.jobs.id, made.jobId));
  // closed long ago with a 30-day period of its own: due for disposal now
  await db().update(s.jobs).set({ status: "closed", closedAt: new Date("2025-01-10T12:00:00Z"), retentionDays: 30 }).where(eq(s.jobs.id, made.jobId));
  due = { ...made, title: j.title };
  ctx = await newContext(browser);
  page = await ctx.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  await signInWithPassword(page, "owner@kestrelmoor.example");
}, 60_000);
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("a job's evidence packages", () => {
  it("are built from the job page with progress, then downloaded whole", async () => {
    await page.goto(`/jobs/${job.jobId}`);
    const section = page.getByTestId("job-evidence-packages");
    await section.getByText("No package yet.").waitFor();
    await section.getByLabel("For whom or why (optional)").fill("For the loss adjuster");
    await section.getByRole("button", { name: "Build package" }).click();
    const item = section.getByTestId("evidence-package").first();
    await expect.poll(() => item.getAttribute("data-state"), { timeout: 60_000 }).toBe("ready");
    await expect.poll(() => item.textContent()).toContain("For the loss adjuster");
    const [row] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.jobId, job.jobId));
    expect(await item.textContent()).toContain("ZIP SHA-256");
    const [download] = await Promise.all([page.waitForEvent("download"), item.getByTestId("package-download").click()]);
    const file = await download.path();
    const bytes = await readFile(file!);
    expect(createHash("sha256").update(bytes).digest("hex")).toBe(row.sha256);
    expect(download.suggestedFilename()).toMatch(/^cairn-evidence-.+\.zip$/);
  });

  it("an owner offers it through a share link, whose page then offers the download", async () => {
    const token = generateShareToken();
    await db()
      .insert(s.shareLinks)
      .values({ organisationId: orgId, jobId: job.jobId, scope: "job", tokenHash: hashShareToken(token), label: "Loss adjuster link", expiresAt: new Date(Date.now() + 86_400_000) });
    await page.goto(`/jobs/${job.jobId}`);
    const item = page.getByTestId("evidence-package").first();
    await item.getByLabel("Offer through a share link").selectOption({ label: "Loss adjuster link" });
    await item.getByRole("button", { name: "Offer package" }).click();
    await item.getByText("The link's page now offers this package.").waitFor();
    const visitor = await newContext(browser);
    const v = await visitor.newPage();
    await v.goto(`/s/${token}`);
    const offer = v.getByTestId("share-evidence-package");
    await offer.waitFor();
    const [row] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.jobId, job.jobId));
    const [download] = await Promise.all([v.waitForEvent("download"), offer.getByRole("link", { name: "Download the evidence package (ZIP)" }).click()]);
    expect(createHash("sha256").update(await readFile((await download.path())!)).digest("hex")).toBe(row.sha256);
    await visitor.close();
  });

  it("of one flight, when the job has several", async () => {
    const second = await makeFlight(orgId, { jobId: job.jobId, flownOn: "2026-03-15" });
    await makeStoredRecording(orgId, job.jobId, second.id, { name: "second-sortie.264" });
    await page.goto(`/jobs/${job.jobId}`);
    const section = page.getByTestId("job-evidence-packages");
    await section.getByLabel("What to package").selectOption({ label: "Flight of 2026-03-15 (Test airframe)" });
    await section.getByRole("button", { name: "Build package" }).click();
    const item = section.getByTestId("evidence-package").first();
    await expect.poll(() => item.textContent(), { timeout: 60_000 }).toContain("one flight");
    await expect.poll(() => item.getAttribute("data-state"), { timeout: 60_000 }).toBe("ready");
    const rows = await db().select({ flightId: s.evidencePackages.flightId, payloadFiles: s.evidencePackages.payloadFiles }).from(s.evidencePackages).where(eq(s.evidencePackages.flightId, second.id));
    expect(rows).toHaveLength(1);
  });

  it("a pilot sees the package but no build button", async () => {
    const pilotCtx = await newContext(browser);
    const p = await pilotCtx.newPage();
    await signInWithPassword(p, "pilot@kestrelmoor.example");
    await p.goto(`/jobs/${job.jobId}`);
    const section = p.getByTestId("job-evidence-packages");
    await section.getByTestId("evidence-package").first().waitFor();
    expect(await section.getByRole("button", { name: "Build package" }).count()).toBe(0);
    await p.goto("/disposal");
    expect(await p.getByRole("heading", { name: "Retention and disposal" }).count()).toBe(0);
    await pilotCtx.close();
  });
});

describe("the disposal page", () => {
  it("lists the due job, builds its final package and disposes of it only with the title typed", async () => {
    await page.goto("/");
    await page.getByRole("link", { name: "Disposal" }).first().click();
    await page.waitForURL(/\/disposal$/);
    const item = page.locator(`[data-testid="disposal-item"][data-job-id="${due.jobId}"]`);
    await item.waitFor();
    expect(await item.textContent()).toContain("2025-02-09");
    expect(await item.textContent()).toContain("Due since 2025-02-09");
    await item.getByRole("button", { name: "Build final package" }).click();
    await expect.poll(() => item.getByTestId("final-package-state").textContent(), { timeout: 60_000 }).toContain("Ready to download");
    await item.getByRole("button", { name: "Dispose of the evidence…" }).click();
    const confirm = item.getByRole("button", { name: "Dispose of the evidence", exact: true });
    expect(await confirm.isDisabled()).toBe(true);
    await item.getByLabel("Type the job's title to confirm").fill(due.title);
    expect(await confirm.isDisabled()).toBe(false);
    await confirm.click();
    await expect.poll(() => item.count(), { timeout: 15_000 }).toBe(0);
    expect(await stat(diskPath(due.recA.originalKey)).then(() => true, () => false)).toBe(false);
    expect(errors).toEqual([]);
  });
});

describe("accessibility (axe-core, WCAG 2.2 rules)", () => {
  it("finds nothing serious or critical on the job page's packages and the disposal page with a confirmation open", async () => {
    const axeSource = await readFile(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");
    // a due job of its own, so the disposal page has a row to confirm
    const other = await makeSharedJob(orgId);
    const [j] = await db().select({ title: s.jobs.title }).from(s.jobs).where(eq(s.jobs.id, other.jobId));
    await db().update(s.jobs).set({ status: "closed", closedAt: new Date("2025-01-10T12:00:00Z"), retentionDays: 30 }).where(eq(s.jobs.id, other.jobId));
    // axe's script is added to the page, so this context bypasses the page's CSP (as tests/e2e/axe-pages.test.ts)
    const axeCtx = await browser.newContext({ baseURL: BASE, viewport: { width: 1280, height: 900 }, bypassCSP: true });
    const p = await axeCtx.newPage();
    await signInWithPassword(p, "owner@kestrelmoor.example");
    const serious = async () => {
      await p.addScriptTag({ content: axeSource });
      const violations = (await p.evaluate(async () => {
        const axe = (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: unknown[] }> } }).axe;
        return (await axe.run(document, { resultTypes: ["violations"] })).violations;
      })) as { id: string; impact: string | null; nodes: { target: string[] }[] }[];
      return violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.impact} ${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(" | ")}`);
    };
    await p.goto(`/jobs/${job.jobId}`);
    await p.getByTestId("evidence-package").first().waitFor();
    expect(await serious()).toEqual([]);
    await p.goto("/disposal");
    const item = p.locator(`[data-testid="disposal-item"][data-job-id="${other.jobId}"]`);
    await item.waitFor();
    await item.getByRole("button", { name: "Dispose of the evidence…" }).click();
    await item.getByLabel("Type the job's title to confirm").fill(j.title.slice(0, 3));
    expect(await serious()).toEqual([]);
    await axeCtx.close();
  });
});
