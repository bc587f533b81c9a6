// The hourly retention sweep on a clock the test controls: packages past their keep date lose their file
// and read as expired (row, SHA-256 and custody events kept), and a package whose queued job Redis lost
// is queued again, once.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { storedExists } from "@/tests/support/stored-files";
import { closeQueues, jobIdFor, queue } from "@/lib/queue/jobs";
import { closeRedis } from "@/lib/queue/redis";
import { runRetentionSweep } from "@/lib/retention/run-retention-sweep";
import { requestEvidencePackage } from "@/lib/evidence-packages/request-evidence-package";
import { demoActors, demoOrganisationId, type Actor, type DemoActorKey } from "@/tests/support/session";
import { buildPackage, jobWithEvidence } from "../evidence-packages/package-fixture";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
const exists = storedExists;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("the retention sweep", () => {
  it("removes a package's file once its keep date has passed, keeping its row and trail", async () => {
    const job = await jobWithEvidence(orgId, actors.owner!.userId);
    const { row } = await buildPackage(actors.owner!, { jobId: job.jobId });
    expect(await exists(row.storageKey!)).toBe(true);
    await runRetentionSweep(new Date(row.expiresAt.getTime() - 60_000));
    expect(await exists(row.storageKey!)).toBe(true);
    await runRetentionSweep(new Date(row.expiresAt.getTime() + 1));
    expect(await exists(row.storageKey!)).toBe(false);
    const [after] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.id, row.id));
    expect(after.state).toBe("expired");
    expect(after.sha256).toBe(row.sha256);
    expect(await db().$count(s.custodyEvents, and(eq(s.custodyEvents.evidenceId, row.id), eq(s.custodyEvents.eventType, "package_built")))).toBe(1);
  }, 60_000);

  it("queues again a package whose job Redis lost, once", async () => {
    const job = await jobWithEvidence(orgId, actors.owner!.userId);
    // asked for, but its job never reached Redis (as after a Redis that lost its data)
    const asked = await requestEvidencePackage(actors.owner!, { jobId: job.jobId }, { enqueueJob: false });
    const jobId = jobIdFor("build-evidence-package", { packageId: asked.id });
    expect(await queue("build-evidence-package").getJob(jobId)).toBeUndefined();
    const [row] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.id, asked.id));
    await runRetentionSweep(new Date(row.updatedAt.getTime() + 5 * 60_000));
    expect(await queue("build-evidence-package").getJob(jobId)).toBeUndefined(); // not stale yet
    const result = await runRetentionSweep(new Date(row.updatedAt.getTime() + 11 * 60_000));
    expect(result.requeuedPackages).toBeGreaterThanOrEqual(1);
    const queued = await queue("build-evidence-package").getJob(jobId);
    expect(queued?.data).toEqual({ packageId: asked.id });
    await queued?.remove();
  });
});
