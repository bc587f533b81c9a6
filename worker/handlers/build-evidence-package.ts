// Job "build-evidence-package": builds one evidence package's BagIt ZIP into the store
// (lib/evidence-packages/write-evidence-package.ts) and commits it with its custody event
// (lib/evidence-packages/commit-built-package.ts). Reloads its row; a ready package whose file is in
// place is left alone, an expired one never rebuilt. A refusal that a retry cannot change (the job
// disposed of meanwhile, the disk too small, an original that no longer matches its SHA-256) fails the
// package at once with its reason; other failures are retried by BullMQ.
import { and, eq, inArray } from "drizzle-orm";
import { UnrecoverableError } from "bullmq";
import { db } from "@/db/client";
import { evidencePackages } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { statKey } from "@/lib/storage/store";
import { commitBuiltPackage } from "@/lib/evidence-packages/commit-built-package";
import { writeEvidencePackage, PackageVerifyError } from "@/lib/evidence-packages/write-evidence-package";
import { PayloadMismatchError } from "@/lib/evidence-packages/write-bag-zip";
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";

export type BuildPackageOutcome = "built" | "already-built" | "expired" | "gone";

export async function buildEvidencePackage(data: JobPayloads["build-evidence-package"], ctx: JobContext = {}): Promise<BuildPackageOutcome> {
  const [pkg] = await db().select().from(evidencePackages).where(eq(evidencePackages.id, data.packageId));
  if (!pkg) return "gone";
  if (pkg.state === "expired") return "expired";
  if (pkg.state === "ready" && pkg.storageKey && (await statKey(pkg.storageKey))) return "already-built";

  await db()
    .update(evidencePackages)
    .set({ state: "building", progress: 2, failureReason: null, updatedAt: new Date() })
    .where(and(eq(evidencePackages.id, pkg.id), inArray(evidencePackages.state, ["queued", "building", "failed", "ready"])));
  let saved = 2;
  const progress = (p: number) => {
    void ctx.progress?.(p);
    if (p - saved < 2 && p < 98) return;
    saved = p;
    void db()
      .update(evidencePackages)
      .set({ progress: p, updatedAt: new Date() })
      .where(and(eq(evidencePackages.id, pkg.id), eq(evidencePackages.state, "building")))
      .catch(() => {});
  };
  try {
    const written = await writeEvidencePackage(pkg, { signal: ctx.signal, onProgress: progress });
    await commitBuiltPackage(pkg, written, { queueJobId: ctx.queueJobId });
    return "built";
  } catch (err) {
    const final = err instanceof ApiError || err instanceof PayloadMismatchError || err instanceof PackageVerifyError;
    await db()
      .update(evidencePackages)
      .set({ state: "failed", failureReason: (err as Error).message.split("\n")[0].slice(0, 400), updatedAt: new Date() })
      .where(and(eq(evidencePackages.id, pkg.id), inArray(evidencePackages.state, ["queued", "building"])))
      .catch(() => {});
    if (final) throw new UnrecoverableError((err as Error).message);
    throw err;
  }
}
