// A job's inspection report end to end, without the queue: findings on two processed recordings,
// stills extracted, a version requested, built by the worker handler, parsed back with pdfjs-dist
// (an independent PDF reader), approved by the owner, downloaded.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import * as findingsApi from "@/app/api/findings/route";
import * as findingApi from "@/app/api/findings/[id]/route";
import * as reportsApi from "@/app/api/reports/route";
import * as reportApi from "@/app/api/reports/[id]/route";
import * as approveApi from "@/app/api/reports/[id]/approve/route";
import * as downloadApi from "@/app/api/reports/[id]/download/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storedBytes, storedSha256, writeStoredBytes } from "@/tests/support/stored-files";
import { describeMoment } from "@/lib/findings/describe-moment";
import { SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";
import { extractStill } from "@/worker/handlers/extract-still";
import { buildReport } from "@/worker/handlers/build-report";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeJob } from "@/tests/support/factories";
import { makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { readPdfText } from "@/tests/support/read-pdf-text";
import { runTool } from "@/tests/support/media/make-h264";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let jobId: string;
let recs: ProcessedRecording[];
type Marked = { id: string; startFrame: number; endFrame: number | null; severity: Severity; note: string; recordingId: string };
const marked: Marked[] = [];
let deletedNote: string;
const HTML_NOTE = `<b>bold?</b> <script>alert("x")</script> & more`;


beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  const job = await makeJob(orgId, { title: "Report test job", pilotId: actors.pilot!.userId, reviewerId: actors.reviewer!.userId });
  jobId = job.id;
  const flight = await makeFlight(orgId, { jobId, maxAltitudeAglM: 135 });
  recs = [
    await makeProcessedRecording(orgId, flight, { seconds: 2, fps: 30, name: "FLIGHT0007.264", sequenceIndex: 0 }),
    // 29.97 fps: the report must print drop-frame SMPTE labels for it
    await makeProcessedRecording(orgId, flight, { seconds: 2, fps: "30000/1001", name: "FLIGHT0008.264", sequenceIndex: 1 }),
  ];
  const mark = async (body: Record<string, unknown>) => {
    const res = await findingsApi.POST(await req(actors.reviewer, "POST", "/api/findings", body));
    expect(res.status).toBe(201);
    const f = await res.json();
    marked.push({ id: f.id, startFrame: f.startFrame, endFrame: f.endFrame, severity: f.severity, note: f.note, recordingId: f.recordingId });
    return f;
  };
  const a = await mark({ recordingId: recs[0].recording.id, startFrame: 7, severity: "critical", note: "Loose ladder bracket", box: { x: 0.5, y: 0.1, w: 0.3, h: 0.4 }, latitude: 54.4131, longitude: -2.6194, heightAglM: 20 });
  const b = await mark({ recordingId: recs[1].recording.id, startFrame: 31, endFrame: 45, severity: "moderate", note: HTML_NOTE });
  await mark({ recordingId: recs[1].recording.id, startFrame: 50, severity: "moderate", note: "Still left pending on purpose" });
  await extractStill({ stillId: a.still.id });
  await extractStill({ stillId: b.still.id });
  deletedNote = "This finding was deleted and must not be printed";
  const gone = await (await findingsApi.POST(await req(actors.reviewer, "POST", "/api/findings", { recordingId: recs[0].recording.id, startFrame: 3, severity: "minor", note: deletedNote }))).json();
  await findingApi.DELETE(await req(actors.reviewer, "DELETE", "/x"), route({ id: gone.id }));
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("building, reading back, approving and downloading a report", () => {
  let reportId: string;
  let pdf: Buffer;

  it("a reviewer requests a version; a second request while it is queued is refused", async () => {
    const res = await reportsApi.POST(await req(actors.reviewer, "POST", "/api/reports", { jobId }));
    expect(res.status).toBe(201);
    const r = await res.json();
    expect(r).toMatchObject({ version: 1, state: "queued", progress: 0, downloadUrl: null });
    reportId = r.id;
    expect((await reportsApi.POST(await req(actors.reviewer, "POST", "/api/reports", { jobId }))).status).toBe(409);
    expect((await reportsApi.POST(await req(actors.pilot, "POST", "/api/reports", { jobId }))).status).toBe(403);
    expect((await reportsApi.POST(await req(actors.other, "POST", "/api/reports", { jobId }))).status).toBe(404);
  });

  it("the worker builds it: stored PDF, recorded SHA-256 matching the bytes, custody entry", async () => {
    expect(await buildReport({ reportId })).toBe("built");
    const view = await (await reportApi.GET(await req(actors.reviewer, "GET", "/x"), route({ id: reportId }))).json();
    expect(view).toMatchObject({ state: "ready", progress: 100, downloadUrl: `/api/reports/${reportId}/download` });
    const [row] = await db().select().from(s.reports).where(eq(s.reports.id, reportId));
    pdf = await storedBytes(row.storageKey!);
    expect(createHash("sha256").update(pdf).digest("hex")).toBe(row.sha256); // Node crypto as the oracle
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const [ev] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, reportId), eq(s.custodyEvents.eventType, "report_built")));
    expect(ev.outputSha256).toBe(row.sha256);
    expect(await buildReport({ reportId })).toBe("already-built");
  });

  it("sets its text in IBM Plex Sans and its figures in IBM Plex Mono, both embedded (poppler's pdffonts)", async () => {
    const file = path.join(os.tmpdir(), `cairn-report-${reportId}.pdf`);
    await writeFile(file, pdf);
    const { stdout } = await runTool("pdffonts", [file]);
    // rows: name type encoding emb sub uni ...; embedded subsets carry a 6-letter prefix ("ABCDEF+")
    const fonts = stdout.split("\n").slice(2).filter(Boolean).map((l) => l.trim().split(/\s+/));
    const byName = (name: RegExp) => fonts.find((f) => name.test(f[0].replace(/^[A-Z]{6}\+/, "")));
    for (const name of [/^IBMPlexSans-/, /^IBMPlexMono-Regular$/]) {
      const row = byName(name);
      expect(row, `${name} in\n${stdout}`).toBeDefined();
      expect(row!.at(-5)).toBe("yes"); // emb
    }
    expect(fonts.some((f) => /Courier/.test(f[0]))).toBe(false);
  });

  it("parsed back with pdfjs-dist: every finding's timecode and severity, every original's hash, notes as plain text", async () => {
    const { text, images } = await readPdfText(pdf);
    const flat = text.replace(/\s+/g, "");
    const rates = new Map([
      [recs[0].recording.id, { num: 30, den: 1 }],
      [recs[1].recording.id, { num: 30000, den: 1001 }],
    ]);
    for (const f of marked) {
      const m = describeMoment(f.startFrame, rates.get(f.recordingId)!);
      expect(text).toContain(m.clock);
      expect(text).toContain(`frame ${f.startFrame}`);
      expect(text).toContain(m.smpte!);
      expect(text).toContain(`${SEVERITY_SCALE[f.severity].label} (FHWA NBI condition rating ${SEVERITY_SCALE[f.severity].nbiRating}`);
      if (f.endFrame !== null) expect(text).toContain(describeMoment(f.endFrame, rates.get(f.recordingId)!).clock);
    }
    // SMPTE ST 12-1 drop-frame at 29.97: frame 31 is labelled 00:00:01;01
    expect(text).toContain("00:00:01;01");
    for (const r of recs) expect(flat).toContain(r.recording.sha256);
    expect(text).toContain(HTML_NOTE);
    expect(text).not.toContain(deletedNote);
    expect(text).toContain("The still was not ready when this report was built.");
    expect(text).toContain("Report test job");
    expect(text).toMatch(/Critical\s*2 \(Critical\)\s*1/); // counts by severity: one critical finding
    expect(text).toMatch(/Moderate\s*5 \(Fair\)\s*2/);
    expect(text).toContain("How the originals were preserved");
    // 135 m AGL flown: the altitude caution is printed (lib/geo/cautions.ts)
    expect(text).toContain("Caution: Above 120 m");
    expect(text).toContain("Caution: Keep the aircraft within visual line of sight");
    // a finding's ground and slant distances from the launch point are printed: so is the radio-range caution
    expect(text).toContain("Caution: Range figures describe the radio link");
    expect(images).toBeGreaterThanOrEqual(2); // the two ready stills are embedded
    // the custody log's newest entry at build time: a real entry of this organisation's chain, with
    // its exact hash, logged before the build's own entry
    const printed = /custody entry (\d+) chain SHA-256 ([0-9a-f]{64})/.exec(text);
    expect(printed, "custody head line").not.toBeNull();
    const orgId = await demoOrganisationId();
    const [entry] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.organisationId, orgId), eq(s.custodyEvents.seq, Number(printed![1]))));
    expect(entry.hash).toBe(printed![2]);
    const [built] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, reportId), eq(s.custodyEvents.eventType, "report_built")));
    expect(entry.seq).toBeLessThan(built.seq);
  });

  it("downloads as an attachment with Range support; access is checked on every request", async () => {
    // a client account never sees a version that is not approved (client-scope.test.ts)
    expect((await downloadApi.GET(await req(actors.client, "GET", "/x"), { params: Promise.resolve({ id: reportId }) })).status).toBe(404);
    const res = await downloadApi.GET(await req(actors.reviewer, "GET", "/x"), { params: Promise.resolve({ id: reportId }) });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="Inspection report - Report test job - v1\.pdf"/);
    expect(Buffer.from(await res.arrayBuffer()).equals(pdf)).toBe(true);
    const part = await downloadApi.GET(await req(actors.reviewer, "GET", "/x", undefined, { range: "bytes=0-4" }), { params: Promise.resolve({ id: reportId }) });
    expect(part.status).toBe(206);
    expect(await part.text()).toBe("%PDF-");
    expect((await downloadApi.GET(await req(actors.other, "GET", "/x"), { params: Promise.resolve({ id: reportId }) })).status).toBe(404);
    expect((await downloadApi.GET(await req(null, "GET", "/x"), { params: Promise.resolve({ id: reportId }) })).status).toBe(401);
    const downloads = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, reportId), eq(s.custodyEvents.eventType, "download")));
    expect(downloads.length).toBe(2); // the full download and the range from byte 0
  });

  it("only an owner approves; approval logs the PDF hash; an approved version is immutable", async () => {
    expect((await approveApi.POST(await req(actors.reviewer, "POST", "/x"), route({ id: reportId }))).status).toBe(403);
    expect((await approveApi.POST(await req(actors.other, "POST", "/x"), route({ id: reportId }))).status).toBe(404);
    const res = await approveApi.POST(await req(actors.owner, "POST", "/x"), route({ id: reportId }));
    expect(res.status).toBe(200);
    const view = await res.json();
    expect(view).toMatchObject({ state: "approved", approvedBy: "Ada Thornbury" });
    const [row] = await db().select().from(s.reports).where(eq(s.reports.id, reportId));
    const [ev] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, reportId), eq(s.custodyEvents.eventType, "report_approved")));
    expect(ev.outputSha256).toBe(row.sha256);
    expect((await approveApi.POST(await req(actors.owner, "POST", "/x"), route({ id: reportId }))).status).toBe(409);
    // a build of the approved version changes nothing
    expect(await buildReport({ reportId })).toBe("immutable");
    expect(await storedSha256(row.storageKey!)).toBe(row.sha256);
    // the next build is a new version
    const next = await (await reportsApi.POST(await req(actors.owner, "POST", "/api/reports", { jobId }))).json();
    expect(next.version).toBe(2);
    expect(await buildReport({ reportId: next.id })).toBe("built");
  });

  it("the database itself refuses to change or remove an approved version, even for the app's own role", async () => {
    const [approved] = await db().select().from(s.reports).where(eq(s.reports.id, reportId));
    expect(approved.state).toBe("approved");
    // the trigger of migration 0002 (a bug or a hand-written UPDATE must not alter what a client was given)
    // drizzle wraps the database's error; its cause is PostgreSQL's own message
    const refusedWith = (text: RegExp) => ({ cause: expect.objectContaining({ message: expect.stringMatching(text), code: "42501" }) });
    await expect(db().update(s.reports).set({ sha256: "0".repeat(64) }).where(eq(s.reports.id, reportId))).rejects.toMatchObject(refusedWith(/approved and final \(UPDATE refused\)/));
    await expect(db().update(s.reports).set({ state: "ready" }).where(eq(s.reports.id, reportId))).rejects.toMatchObject(refusedWith(/approved and final/));
    await expect(db().delete(s.reports).where(eq(s.reports.id, reportId))).rejects.toMatchObject(refusedWith(/approved and final \(DELETE refused\)/));
    const [after] = await db().select().from(s.reports).where(eq(s.reports.id, reportId));
    expect(after).toEqual(approved);
  });

  it("a version whose stored PDF changed after the build cannot be approved", async () => {
    const next = await (await reportsApi.POST(await req(actors.owner, "POST", "/api/reports", { jobId }))).json();
    expect(await buildReport({ reportId: next.id })).toBe("built");
    const [row] = await db().select().from(s.reports).where(eq(s.reports.id, next.id));
    await writeStoredBytes(row.storageKey!, Buffer.concat([pdf, Buffer.from("\n% tampered\n")]));
    const res = await approveApi.POST(await req(actors.owner, "POST", "/x"), route({ id: next.id }));
    expect(res.status).toBe(409);
    const [after] = await db().select().from(s.reports).where(eq(s.reports.id, next.id));
    expect(after.state).toBe("ready");
  });

  it("a build abandoned by a dead worker does not block the job for ever", async () => {
    const [stuck] = await db()
      .insert(s.reports)
      .values({ organisationId: orgId, jobId, version: 50, state: "building", progress: 30, updatedAt: new Date(Date.now() - 3 * 3600_000) })
      .returning();
    const res = await reportsApi.POST(await req(actors.reviewer, "POST", "/api/reports", { jobId }));
    expect(res.status).toBe(201);
    expect((await res.json()).version).toBe(51);
    const [after] = await db().select().from(s.reports).where(eq(s.reports.id, stuck.id));
    expect(after.state).toBe("failed");
    // a build that moved recently still blocks
    expect((await reportsApi.POST(await req(actors.reviewer, "POST", "/api/reports", { jobId }))).status).toBe(409);
  });
});
