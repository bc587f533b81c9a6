// Helpers for the evidence-package tests: a job with stored evidence (sharing's fixtures), its upload
// events in the custody chain, a built package, and the tools that check a package from outside Cairn:
// Info-ZIP unzip, GNU coreutils sha256sum, and the Library of Congress's bagit-python when installed.
import { execFile } from "node:child_process";
import { mkdtemp } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { requestEvidencePackage, type PackageRequest } from "@/lib/evidence-packages/request-evidence-package";
import { buildEvidencePackage } from "@/worker/handlers/build-evidence-package";
import { makeSharedJob } from "../sharing/share-fixtures";

export const run = promisify(execFile);

/** Exit code and output of a command that may fail (sha256sum -c, bagit --validate). */
export async function tryRun(cmd: string, args: string[], cwd?: string): Promise<{ code: number; out: string }> {
  try {
    const { stdout, stderr } = await run(cmd, args, { cwd, maxBuffer: 64 * 1024 * 1024 });
    return { code: 0, out: stdout + stderr };
  } catch (err) {
    const e = err as { code?: number; stdout?: string; stderr?: string };
    return { code: typeof e.code === "number" ? e.code : 1, out: `${e.stdout ?? ""}${e.stderr ?? ""}` };
  }
}

/** Whether Python's bagit module (LibraryOfCongress/bagit-python) can be imported here. */
export async function hasPythonBagit(): Promise<boolean> {
  return (await tryRun("python3", ["-c", "import bagit"])).code === 0;
}

export async function unzipTo(zipFile: string): Promise<string> {
  const dir = await mkdtemp(path.join(os.tmpdir(), "cairn-bag-"));
  // unzip exits 1 for warnings and 2 for CRC errors (Info-ZIP unzip manual, "DIAGNOSTICS"); the files
  // are written either way, which is what the tamper test relies on
  await tryRun("unzip", ["-q", "-o", zipFile, "-d", dir]);
  return dir;
}

export async function jobWithEvidence(organisationId: string, ownerUserId: string) {
  const job = await makeSharedJob(organisationId);
  for (const rec of [job.recA, job.recB]) {
    await recordCustodyEvent({ organisationId, eventType: "upload", evidenceType: "recording", evidenceId: rec.id, jobId: job.jobId, originalSha256: rec.sha256, originalSize: rec.originalBytes.length, actor: { userId: ownerUserId, role: "owner" }, purpose: "test upload" });
  }
  return job;
}

export async function buildPackage(member: { organisationId: string; userId: string }, input: PackageRequest) {
  const asked = await requestEvidencePackage(member, input, { enqueueJob: false });
  const outcome = await buildEvidencePackage({ packageId: asked.id });
  const [row] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.id, asked.id));
  return { outcome, row };
}
