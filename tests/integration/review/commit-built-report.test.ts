// The commit of a report build on its own, without rendering or the worker: a version in "building"
// becomes "ready" with the PDF's key, size and SHA-256 and one custody event; a version that moved on
// (approved, failed, already committed) is refused and nothing is recorded.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { reportKey } from "@/lib/storage/storage-keys";
import { commitBuiltReport } from "@/lib/reports/commit-built-report";
import { demoActors, demoOrganisationId, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeJob } from "@/tests/support/factories";

let orgId: string;
let jobId: string;
let actors: Record<DemoActorKey, Actor>;
let version = 0;

beforeAll(async () => {
  orgId = await demoOrganisationId();
  actors = await demoActors();
  jobId = (await makeJob(orgId)).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

async function reportIn(state: "building" | "approved" | "failed" | "queued") {
  const [row] = await db()
    .insert(s.reports)
    .values({ organisationId: orgId, jobId, version: ++version, state, createdBy: actors.reviewer!.userId })
    .returning();
  return row;
}
const pdf = Buffer.from("%PDF-1.7 test bytes");
// the digest a reader of the file would compute (node:crypto)
const sha256 = createHash("sha256").update(pdf).digest("hex");
const built = (report: Awaited<ReturnType<typeof reportIn>>) => ({ report, storageKey: reportKey(orgId, jobId, report.id), sizeBytes: pdf.length, sha256, findings: 2, recordings: 1 });
const eventsOf = (reportId: string) => db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, reportId), eq(s.custodyEvents.eventType, "report_built")));

describe("commitBuiltReport", () => {
  it("a building version becomes ready with the PDF's key, size and digest, and one custody event", async () => {
    const report = await reportIn("building");
    await commitBuiltReport(built(report));
    const [row] = await db().select().from(s.reports).where(eq(s.reports.id, report.id));
    expect(row).toMatchObject({ state: "ready", progress: 100, storageKey: reportKey(orgId, jobId, report.id), sizeBytes: pdf.length, sha256, failureReason: null });
    const events = await eventsOf(report.id);
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ jobId, outputSha256: sha256, storageLocation: row.storageKey, actorUserId: actors.reviewer!.userId, tool: "@react-pdf/renderer" });
    expect(events[0].details).toMatchObject({ version: report.version, findings: 2, recordings: 1, sizeBytes: pdf.length });
  });

  it("a second commit of the same build is refused and records nothing more", async () => {
    const report = await reportIn("building");
    await commitBuiltReport(built(report));
    await expect(commitBuiltReport(built(report))).rejects.toThrow(/left the building state/);
    expect(await eventsOf(report.id)).toHaveLength(1);
  });

  it.each(["approved", "failed", "queued"] as const)("a version %s is left as it is", async (state) => {
    const report = await reportIn(state);
    await expect(commitBuiltReport(built(report))).rejects.toThrow(/left the building state/);
    const [row] = await db().select().from(s.reports).where(eq(s.reports.id, report.id));
    expect(row).toMatchObject({ state, storageKey: null, sha256: null });
    expect(await eventsOf(report.id)).toEqual([]);
  });
});
