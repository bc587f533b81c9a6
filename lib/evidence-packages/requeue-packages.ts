// Packages asked for but never started, because Redis lost their job (PostgreSQL is the record of
// truth, Redis only a queue of work): queued again by the hourly retention sweep. The job id is
// deterministic (lib/queue/jobs.ts), so a package whose job is still waiting is not queued twice.
import "server-only";
import { and, eq, lte } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages } from "@/db/schema";
import { enqueue } from "@/lib/queue/jobs";

const STALE_AFTER_MS = 10 * 60_000; // 10 min: far longer than a queued job waits on an idle worker

export async function requeueLostPackages(now: Date): Promise<string[]> {
  const stale = await db()
    .select({ id: evidencePackages.id })
    .from(evidencePackages)
    .where(and(eq(evidencePackages.state, "queued"), lte(evidencePackages.updatedAt, new Date(now.getTime() - STALE_AFTER_MS))));
  for (const p of stale) await enqueue("build-evidence-package", { packageId: p.id });
  return stale.map((p) => p.id);
}
