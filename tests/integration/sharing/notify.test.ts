// Crew notifications through nodemailer to the local fake SMTP server: processing finished (ready
// or failed) and report approved, each sent once per fact, to the job's crew only.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { notifyProcessingFinished, notifyReportApproved } from "@/lib/mail/notifications";
import { readMailbox, type StoredMail } from "@/lib/mail/read-mailbox";
import { demoOrganisationId } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { env } from "@/lib/config/env";
import { makeReport, makeStoredRecording } from "./share-fixtures";
import { computeRecordingFigures } from "@/lib/recordings/recording-figures";

let orgId: string;
let crew: { pilot: string; reviewer: string; client: string; uploader: string; outsider: string };
let uploaderId: string;
let jobId: string;
let flightId: string;

async function member(role: "owner" | "pilot" | "reviewer" | "client", label: string, organisationId: string) {
  const email = `${label}-${randomUUID().slice(0, 8)}@crew.example`;
  const [u] = await db().insert(s.users).values({ email, name: `Test ${label}` }).returning();
  await db().insert(s.memberships).values({ organisationId, userId: u.id, role });
  return { id: u.id, email };
}

async function mailsTo(to: string, atLeast = 1, waitMs = 5000): Promise<StoredMail[]> {
  const end = Date.now() + waitMs;
  for (;;) {
    const got = await readMailbox({ to });
    if (got.length >= atLeast || Date.now() > end) return got;
    await new Promise((r) => setTimeout(r, 100));
  }
}

beforeAll(async () => {
  orgId = await demoOrganisationId();
  const [otherOrg] = await db().select({ id: s.organisations.id }).from(s.organisations).where(eq(s.organisations.slug, "harrowfell"));
  const pilot = await member("pilot", "pilot", orgId);
  const reviewer = await member("reviewer", "reviewer", orgId);
  const client = await member("client", "client", orgId);
  const uploader = await member("pilot", "uploader", orgId);
  const outsider = await member("owner", "outsider", otherOrg.id);
  crew = { pilot: pilot.email, reviewer: reviewer.email, client: client.email, uploader: uploader.email, outsider: outsider.email };
  const flight = await makeFlight(orgId);
  jobId = flight.jobId;
  flightId = flight.id;
  // the client account is set as the job's reviewer by mistake: clients are never crew
  await db().update(s.jobs).set({ pilotId: pilot.id, reviewerId: client.id }).where(eq(s.jobs.id, jobId));
  await db().update(s.flights).set({ pilotId: reviewer.id }).where(eq(s.flights.id, flightId));
  uploaderId = uploader.id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("processing finished", () => {
  it("mails the crew once, with a link to the recording, in text and HTML", async () => {
    const rec = await makeStoredRecording(orgId, jobId, flightId, { name: "pass-ready.264" });
    await db().update(s.recordings).set({ uploadedBy: uploaderId }).where(eq(s.recordings.id, rec.id));
    const first = await notifyProcessingFinished(rec.id);
    expect(first.sent.sort()).toEqual([crew.pilot, crew.reviewer, crew.uploader].sort());
    const [mail] = await mailsTo(crew.pilot);
    expect(mail.subject).toContain("Ready to review: pass-ready.264");
    expect(mail.text).toContain(`${env().APP_URL}/recordings/${rec.id}`);
    expect(mail.html).toContain(`/recordings/${rec.id}`);
    expect(mail.to.sort()).toEqual([crew.pilot, crew.reviewer, crew.uploader].sort());
    // the worker retries: no second mail for the same outcome
    expect(await notifyProcessingFinished(rec.id)).toMatchObject({ sent: [], skipped: "already sent" });
    await new Promise((r) => setTimeout(r, 300));
    expect((await readMailbox({ to: crew.pilot })).filter((m) => m.subject.includes("pass-ready.264"))).toHaveLength(1);
    expect(await readMailbox({ to: crew.client })).toHaveLength(0);
  });

  it("gives the stored figures: duration, frame slots and the lost count, 'at least' where it is a lower bound", async () => {
    const rec = await makeStoredRecording(orgId, jobId, flightId, { name: "pass-figures.264" });
    const states = new Uint8Array(360);
    states.fill(2, 100, 145); // 45 lost frame slots
    const figures = computeRecordingFigures({ frameRate: { num: 30, den: 1 }, states, framesLostIsLowerBound: true, rendition: "reencode" });
    await db().update(s.recordings).set({ figures, durationSec: figures.durationSeconds }).where(eq(s.recordings.id, rec.id));
    await notifyProcessingFinished(rec.id);
    const [mail] = (await mailsTo(crew.pilot)).filter((m) => m.subject.includes("pass-figures.264"));
    expect(mail.text).toContain("Duration 00:00:12.000 (360 frames, at least 45 lost)."); // the clock notation the player, table and trace use
  });

  it("says so when processing failed, with the reason", async () => {
    const rec = await makeStoredRecording(orgId, jobId, flightId, { name: "pass-broken.264" });
    await db().update(s.recordings).set({ state: "failed", failureReason: "no video track", processedAt: null }).where(eq(s.recordings.id, rec.id));
    expect((await notifyProcessingFinished(rec.id)).sent).toContain(crew.pilot);
    const mails = await mailsTo(crew.reviewer, 2);
    const failed = mails.find((m) => m.subject.includes("pass-broken.264"))!;
    expect(failed.subject).toContain("Processing failed");
    expect(failed.text).toContain("no video track");
  });

  it("sends nothing while the recording is still waiting, or for an unknown id", async () => {
    const rec = await makeStoredRecording(orgId, jobId, flightId, { name: "pass-waiting.264" });
    await db().update(s.recordings).set({ state: "processing" }).where(eq(s.recordings.id, rec.id));
    expect(await notifyProcessingFinished(rec.id)).toMatchObject({ sent: [], skipped: "still processing" });
    expect(await notifyProcessingFinished(randomUUID())).toMatchObject({ sent: [], skipped: "no such recording" });
  });
});

describe("report approved", () => {
  it("mails the crew once per approved version; a version not approved sends nothing", async () => {
    const { report } = await makeReport(orgId, jobId, { state: "ready" });
    expect(await notifyReportApproved(report.id)).toMatchObject({ sent: [], skipped: "report is ready" });
    await db().update(s.reports).set({ state: "approved", approvedAt: new Date() }).where(eq(s.reports.id, report.id));
    const r = await notifyReportApproved(report.id);
    expect(r.sent.sort()).toEqual([crew.pilot, crew.reviewer].sort());
    const mails = await mailsTo(crew.pilot, 2);
    const approved = mails.find((m) => m.subject.startsWith("Report approved"))!;
    expect(approved.subject).toContain(`version ${report.version}`);
    expect(approved.text).toContain(`${env().APP_URL}/jobs/${jobId}`);
    expect(await notifyReportApproved(report.id)).toMatchObject({ skipped: "already sent" });
    expect(await readMailbox({ to: crew.outsider })).toHaveLength(0);
  });
});
