// Asks for an evidence package: everything a request can be refused for is checked first
// (collect-package-contents.ts: unknown or foreign job, flight or recording, deleted recordings, a
// disposed job, nothing to package; check-free-space.ts: a package larger than the free disk, with
// the figures), then one row is written and the worker's job queued. A job under legal hold may be
// packaged.
import "server-only";
import { count } from "drizzle-orm";
import { db } from "@/db/client";
import { custodyEvents, evidencePackages } from "@/db/schema";
import type { Member } from "@/lib/auth/load-member";
import { localSpaceFolder } from "@/lib/storage/store";
import { enqueue } from "@/lib/queue/jobs";
import { checkFreeSpace } from "./check-free-space";
import { collectPackageContents, estimatePackageBytes, packageTrailCondition, type PackageSelection } from "./collect-package-contents";
import { DAY_MS, packageSettings } from "./package-settings";

export type PackageRequest = PackageSelection & { purpose?: string | null };

export async function requestEvidencePackage(member: Pick<Member, "organisationId" | "userId">, input: PackageRequest, opts: { now?: Date; enqueueJob?: boolean } = {}) {
  const now = opts.now ?? new Date();
  const contents = await collectPackageContents(member.organisationId, input);
  const [{ n }] = await db().select({ n: count() }).from(custodyEvents).where(packageTrailCondition(member.organisationId, contents));
  const estimatedBytes = estimatePackageBytes(contents, n);
  const settings = packageSettings();
  const disk = await checkFreeSpace(await localSpaceFolder(), estimatedBytes, settings.diskReserveBytes);
  const [row] = await db()
    .insert(evidencePackages)
    .values({
      organisationId: member.organisationId,
      jobId: contents.job.id,
      flightId: contents.flight?.id ?? null,
      recordingIds: contents.selection === "recordings" ? contents.recordings.map((r) => r.id) : null,
      estimatedBytes,
      purpose: input.purpose?.trim() || null,
      createdBy: member.userId,
      expiresAt: new Date(now.getTime() + settings.keepDays * DAY_MS),
    })
    .returning({ id: evidencePackages.id, state: evidencePackages.state, estimatedBytes: evidencePackages.estimatedBytes, expiresAt: evidencePackages.expiresAt });
  if (opts.enqueueJob !== false) await enqueue("build-evidence-package", { packageId: row.id });
  return { ...row, recordings: contents.recordings.length, files: contents.files.length, freeBytes: disk.freeBytes };
}
