// Client sharing in a real browser (Debian chromium) against the built app: the owner shares a
// finding's clip with a client e-mail; the mail arrives at the fake SMTP server; a fresh browser
// context (no account) opens the link, plays the clip, jumps to the finding and downloads the
// report; the owner revokes; the link now shows the revoked page. Then the raw token is searched
// for in the server logs and a dump of the database.
//
// Test evidence is inserted directly (tests/integration/sharing/share-fixtures.ts): a playable MP4
// made by Debian's ffmpeg from a lavfi test pattern, findings rows with stills, and a report row
// whose PDF is a small real document rendered here with @react-pdf/renderer. The upload, processing
// and report-building paths have browser tests of their own.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import { readdir, readFile, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { createElement } from "react";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword, BASE } from "@/tests/support/browser";
import { makeRawH264, runTool } from "@/tests/support/media/make-h264";
import { TEST_ENV } from "@/tests/support/test-env";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { hashShareToken } from "@/lib/sharing/share-token";
import { eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { demoOrganisationId } from "@/tests/support/session";
import { makeSharedJob, sha256 } from "@/tests/integration/sharing/share-fixtures";

let browser: Browser;
let owner: BrowserContext;
let client: BrowserContext;
let ownerPage: Page;
let clientPage: Page;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let shareUrl = "";
const recipient = `claims-${randomUUID().slice(0, 8)}@client.example`;
const root = path.resolve(__dirname, "../..");

async function playableMp4(): Promise<Buffer> {
  // a raw controller-like stream remuxed without re-encoding, as docs/library-notes.md describes
  const raw = await makeRawH264({ seconds: 4, width: 432, height: 240, fps: 30 });
  const out = path.join(os.tmpdir(), `cairn-e2e-share-${process.pid}.mp4`);
  await runTool("ffmpeg", ["-v", "error", "-y", "-f", "h264", "-r", "30", "-i", raw, "-c", "copy", "-movflags", "+faststart", out]);
  return readFile(out);
}

async function stillJpeg(mp4: Buffer): Promise<Buffer> {
  const src = path.join(os.tmpdir(), `cairn-e2e-share-still-${process.pid}.mp4`);
  const out = path.join(os.tmpdir(), `cairn-e2e-share-still-${process.pid}.jpg`);
  await writeFile(src, mp4);
  await runTool("ffmpeg", ["-v", "error", "-y", "-ss", "1.5", "-i", src, "-frames:v", "1", out]);
  return readFile(out);
}

async function reportPdf(): Promise<Buffer> {
  const pdf = await import("@react-pdf/renderer");
  const doc = createElement(
    pdf.Document,
    { title: "Inspection report" },
    createElement(pdf.Page, { size: "A4" }, createElement(pdf.Text, null, "Valve tower annual inspection: 1 major finding (test report).")),
  );
  return pdf.renderToBuffer(doc as Parameters<typeof pdf.renderToBuffer>[0]);
}

// a loaded 2-core machine: give UI updates time before calling them missing
const POLL = { timeout: 15_000, interval: 100 };

const videoTime = (p: Page) => p.evaluate(() => document.querySelector<HTMLVideoElement>("[data-testid=share-video] video, video")?.currentTime ?? -1);

beforeAll(async () => {
  const orgId = await demoOrganisationId();
  const mp4 = await playableMp4();
  // the fixture's approved report is a real PDF (an approved row cannot be changed afterwards)
  const pdf = await reportPdf();
  job = await makeSharedJob(orgId, { playable: mp4, image: await stillJpeg(mp4), durationSec: 4, pdf });
  job.pdf = pdf;
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("sharing a finding's clip with a client", () => {
  it("the owner shares one finding with the report attached, mailed to the client", async () => {
    owner = await newContext(browser);
    ownerPage = await owner.newPage();
    await signInWithPassword(ownerPage, "owner@kestrelmoor.example");
    await ownerPage.goto(`/custody/jobs/${job.jobId}`);
    await ownerPage.getByRole("button", { name: "Share with client" }).click();
    const form = ownerPage.getByRole("dialog", { name: "Share with client" });
    // checked in the browser with the route's own schema before anything is sent
    await form.getByLabel("What to share").selectOption("recording");
    await form.getByLabel("Recipients' e-mails").fill("not-an-address");
    let posted = 0;
    ownerPage.on("request", (r) => void (r.method() === "POST" && r.url().endsWith("/api/share-links") && posted++));
    await form.getByRole("button", { name: "Create share link" }).click();
    await form.getByText("Give the link a label you will recognise").waitFor();
    await form.getByText("Choose the recording to share").waitFor();
    await form.getByText("Not an e-mail address").waitFor();
    expect(posted).toBe(0);
    await form.getByLabel("Label").fill("Cracked mortar joint, valve tower");
    await form.getByLabel("What to share").selectOption("findings");
    await form.getByRole("checkbox").first().waitFor();
    await form.locator("label", { hasText: "Hairline crack along the mortar joint" }).getByRole("checkbox").check();
    // the approved report version is attached by default
    expect(await form.getByLabel("Attach a report version").inputValue()).toBe(job.report.id);
    await form.getByLabel("Recipients' e-mails").fill(recipient);
    await form.getByRole("button", { name: "Create share link" }).click();
    const done = ownerPage.getByRole("dialog", { name: "Share link created" });
    await expect.poll(() => done.getByTestId("share-mailed").textContent(), POLL).toContain(recipient);
    shareUrl = await done.getByLabel("Share link address").inputValue();
    expect(shareUrl).toMatch(new RegExp(`^${BASE}/s/[A-Za-z0-9_-]{43}$`));
    await done.getByRole("button", { name: "Done" }).click();
    await expect.poll(() => ownerPage.getByTestId("share-link-row").count(), POLL).toBe(1);
  });

  it("the mail arrives at the fake SMTP server with the link and its expiry", async () => {
    let mail;
    for (let i = 0; i < 100 && !mail; i++) {
      [mail] = await readMailbox({ to: recipient });
      if (!mail) await new Promise((r) => setTimeout(r, 100));
    }
    expect(mail).toBeTruthy();
    expect(mail!.subject).toContain("Kestrelmoor Aerial Survey shared: Cracked mortar joint, valve tower");
    expect(mail!.text).toContain(shareUrl);
    expect(mail!.html).toContain(shareUrl);
    expect(mail!.text).toMatch(/works until \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
  });

  it("a fresh browser opens the link: organisation name, the clip plays, jumps to the finding, downloads the report", async () => {
    client = await newContext(browser);
    clientPage = await client.newPage();
    const res = await clientPage.goto(shareUrl);
    expect(clientPage.url()).toBe(`${shareUrl}/view`);
    expect(res!.status()).toBe(200);
    const h = res!.headers();
    expect(h["referrer-policy"]).toBe("no-referrer");
    expect(h["x-robots-tag"]).toContain("noindex");
    expect(h["cache-control"]).toContain("no-store");

    await expect.poll(() => clientPage.getByTestId("share-org").textContent(), POLL).toBe("Kestrelmoor Aerial Survey");
    expect(await clientPage.getByRole("heading", { name: "Cracked mortar joint, valve tower" }).count()).toBe(1);
    // only the shared finding is listed: the other recording's finding is not
    expect(await clientPage.getByTestId("share-finding").count()).toBe(1);
    expect(await clientPage.getByText("Loose ladder cage bolt").count()).toBe(0);

    // play
    await clientPage.locator(".vjs-big-play-button").click();
    await clientPage.waitForFunction(() => (document.querySelector("video")?.currentTime ?? 0) > 0.3, null, { timeout: 20_000 });
    await clientPage.evaluate(() => document.querySelector("video")!.pause());

    // jump to the finding (1.500 s) from the list, then from its marker on the timeline
    await clientPage.evaluate(() => {
      document.querySelector("video")!.currentTime = 3.5;
    });
    await clientPage.getByRole("button", { name: /Jump to 00:00:01\.500/ }).click();
    await expect.poll(() => videoTime(clientPage), POLL).toBeCloseTo(1.5, 1);
    await expect.poll(() => clientPage.getByTestId("share-current-time").textContent(), POLL).toBe("00:00:01.500");
    await clientPage.evaluate(() => {
      document.querySelector("video")!.currentTime = 0.2;
    });
    await clientPage.getByRole("button", { name: "Jump to Major finding at 00:00:01.500" }).click();
    await expect.poll(() => videoTime(clientPage), POLL).toBeCloseTo(1.5, 1);

    // the finding's still is served through its signed address and decodes as an image
    await clientPage.waitForFunction(() => {
      const img = document.querySelector<HTMLImageElement>("[data-testid=share-finding] img");
      return Boolean(img && img.complete && img.naturalWidth > 0);
    });

    // the report: its bytes are the stored PDF, and match the SHA-256 shown on the page
    expect(await clientPage.locator(`[data-hash="${sha256(job.pdf)}"]`).count()).toBe(1);
    const [download] = await Promise.all([clientPage.waitForEvent("download"), clientPage.getByRole("link", { name: "Download the report (PDF)" }).click()]);
    const bytes = await readFile((await download.path())!);
    expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(sha256(bytes)).toBe(sha256(job.pdf));
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
  });

  it("the client's viewing is counted for the share link in the recording's playback analytics", async () => {
    // The watch time arrives in a later beacon than the view's first one, and that beacon carries no
    // media grant (mux-embed sends custom_1 in a view's first event only): the collector adds it to
    // the view the first beacon proved (lib/playback-analytics/share-viewer.ts knownShareViewer); before, it was
    // refused and the row kept 0. The page stays open until then: mux-embed sends its queue every 10 s
    // and once more on pagehide, but skips that last send while an earlier POST is still in flight.
    const [link] = await db().select({ id: s.shareLinks.id }).from(s.shareLinks).where(eq(s.shareLinks.tokenHash, hashShareToken(shareUrl.split("/").pop()!)));
    const views = () => db().select().from(s.playbackViews).where(eq(s.playbackViews.shareLinkId, link.id));
    await expect.poll(async () => Math.max(-1, ...(await views()).map((v) => v.watchTimeMs)), { timeout: 45_000, interval: 500 }).toBeGreaterThan(0);
    await clientPage.goto("about:blank");
    // one viewing, one view: every beacon of the page landed on the same row
    const rows = await views();
    expect(rows).toHaveLength(1);
    expect(rows[0].viewerUserId).toBeNull();
    expect(rows[0].watchTimeMs).toBeGreaterThan(0);
  });

  it("the owner sees the open and the download, revokes, and the link shows the revoked page", async () => {
    await ownerPage.reload();
    const row = ownerPage.getByTestId("share-link-row").first();
    await expect.poll(() => row.getByTestId("share-opens").textContent(), POLL).toBe("1");
    await expect.poll(() => row.getByTestId("share-downloads").textContent(), POLL).toBe("1");
    await row.getByRole("button", { name: /Revoke/ }).click();
    await row.getByRole("button", { name: "Revoke now" }).click();
    await expect.poll(() => row.locator("[data-status]").getAttribute("data-status"), POLL).toBe("revoked");

    const res = await clientPage.goto(shareUrl);
    expect(res!.status()).toBe(410);
    expect(await clientPage.getByRole("heading", { name: "This share link has been revoked" }).count()).toBe(1);
    expect(res!.headers()["referrer-policy"]).toBe("no-referrer");
    // the viewer address sends the visitor back to the door, which answers 410 too
    const again = await clientPage.goto(`${shareUrl}/view`);
    expect(again!.status()).toBe(410);
  });

  it("the raw token is in no server log and nowhere in the database", async () => {
    const token = shareUrl.split("/").pop()!;
    const logDir = path.join(root, ".data/logs");
    const mine = (await readdir(logDir)).filter((n) => n.startsWith(`e2e-${TEST_ENV.NEXT_DIST_DIR.replace(/^\./, "")}-`));
    expect(mine.length).toBeGreaterThanOrEqual(2);
    for (const name of mine) expect((await readFile(path.join(logDir, name), "utf8")).includes(token), name).toBe(false);
    const dump = execFileSync("pg_dump", ["--data-only", "--no-owner", "--dbname", TEST_ENV.MIGRATION_DATABASE_URL], { maxBuffer: 1024 ** 3 }).toString("utf8");
    expect(dump).toContain(hashShareToken(token)); // the right database: the link's hash is there
    expect(dump.includes(token)).toBe(false);
  });
});
