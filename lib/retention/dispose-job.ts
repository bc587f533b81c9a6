// Disposes of a closed job's evidence once its retention period is over: only an owner, only after
// typing the job's title to confirm, never under a legal hold (the refusal is itself a custody event),
// never before the disposal date. The files go (originals, renditions, stills, report PDFs, evidence
// packages other than a final one, which keeps its own keep date so it can still be handed over); the
// rows and the whole custody trail stay, and the disposal adds to it: one event per recording with the
// SHA-256 of each file destroyed, and one for the job naming every file and who confirmed.
import "server-only";
import { and, eq, inArray, isNull, ne, notInArray } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, evidencePackages, jobs, organisations, recordings, renditions, reports, sites, stills, users } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";
import { removeKey } from "@/lib/storage/store";
import { assertStoreKey, derivedFolderKey } from "@/lib/storage/storage-keys";
import { FINAL_PACKAGE_PURPOSE } from "./list-disposals";
import { daysUntil, disposalDate, effectiveRetention } from "./retention-period";

export type DisposedFile = { kind: "original" | "rendition" | "still" | "report" | "evidence_package"; evidenceId: string; storageKey: string; sha256: string | null; sizeBytes: number | null };
export type DisposalResult = { jobId: string; disposedAt: string; recordings: number; files: DisposedFile[]; keptFinalPackages: string[] };

type Confirmer = Pick<Member, "organisationId" | "userId" | "role">;

async function refuseHeld(member: Confirmer, job: { id: string; legalHoldReason: string | null }, facts: RequestFacts): Promise<never> {
  // its own transaction: the refusal stays on record although the request fails
  await recordCustodyEvent({
    organisationId: member.organisationId,
    eventType: "disposal_refused",
    evidenceType: "job",
    evidenceId: job.id,
    jobId: job.id,
    actor: { userId: member.userId, role: member.role },
    ...facts,
    purpose: `Disposal refused: the job is under legal hold (${job.legalHoldReason ?? "no reason given"})`,
    details: { refusedBecause: "legal_hold" },
  });
  throw new ApiError("locked", "This job is under legal hold: its evidence cannot be disposed of until the hold is released. A package can still be built.");
}

export async function disposeJob(member: Confirmer, jobId: string, input: { confirmTitle: string }, facts: RequestFacts, now = new Date()): Promise<DisposalResult> {
  if (member.role !== "owner") throw new ApiError("forbidden", "Only an owner may dispose of evidence");
  const outcome = await db().transaction(async (tx) => {
    const [job] = await tx
      .select({
        id: jobs.id,
        title: jobs.title,
        status: jobs.status,
        closedAt: jobs.closedAt,
        disposedAt: jobs.disposedAt,
        legalHold: jobs.legalHold,
        legalHoldReason: jobs.legalHoldReason,
        jobDays: jobs.retentionDays,
        siteId: jobs.siteId,
      })
      .from(jobs)
      .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, member.organisationId)))
      .for("update");
    if (!job) throw notFound("Job not found");
    if (job.disposedAt) throw new ApiError("gone", `This job's evidence was already disposed of on ${job.disposedAt.toISOString().slice(0, 10)}.`);
    if (job.status !== "closed" || !job.closedAt) throw new ApiError("conflict", "Only a closed job can be disposed of.");
    const [periods] = await tx
      .select({ clientDays: clients.retentionDays, organisationDays: organisations.retentionDays })
      .from(sites)
      .innerJoin(clients, eq(clients.id, sites.clientId))
      .innerJoin(organisations, eq(organisations.id, sites.organisationId))
      .where(eq(sites.id, job.siteId));
    const retention = effectiveRetention(job.jobDays, periods?.clientDays ?? null, periods?.organisationDays ?? null);
    if (!retention) throw new ApiError("conflict", "No retention period applies to this job, so it has no disposal date.");
    const date = disposalDate(job.closedAt, retention.days);
    const left = daysUntil(date, now);
    if (left > 0) throw new ApiError("conflict", `This job is kept until ${date} (${left} more day${left === 1 ? "" : "s"}); it cannot be disposed of before.`);
    if (job.legalHold) return { held: true as const, job };
    if (input.confirmTitle.trim() !== job.title.trim()) throw new ApiError("unprocessable", "Type the job's title exactly to confirm", { confirmTitle: ["Type the job's title exactly to confirm"] });

    const recs = await tx
      .select({ id: recordings.id, sha256: recordings.sha256, sizeBytes: recordings.sizeBytes, storageKey: recordings.storageKey, deletedAt: recordings.deletedAt })
      .from(recordings)
      .where(and(eq(recordings.organisationId, member.organisationId), eq(recordings.jobId, job.id)));
    const live = recs.filter((r) => !r.deletedAt);
    const liveIds = live.map((r) => r.id);
    const rend = liveIds.length
      ? await tx.select({ id: renditions.id, recordingId: renditions.recordingId, storageKey: renditions.storageKey, sha256: renditions.sha256, sizeBytes: renditions.sizeBytes }).from(renditions).where(and(eq(renditions.organisationId, member.organisationId), inArray(renditions.recordingId, liveIds)))
      : [];
    const stl = liveIds.length
      ? await tx.select({ id: stills.id, recordingId: stills.recordingId, storageKey: stills.storageKey, sha256: stills.sha256 }).from(stills).where(and(eq(stills.organisationId, member.organisationId), inArray(stills.recordingId, liveIds)))
      : [];
    // an original whose bytes also serve a live duplicate upload in another job stays (as in deletion)
    const sharers = liveIds.length
      ? await tx
          .select({ duplicateOfId: recordings.duplicateOfId })
          .from(recordings)
          .where(and(eq(recordings.organisationId, member.organisationId), inArray(recordings.duplicateOfId, liveIds), isNull(recordings.deletedAt), ne(recordings.jobId, job.id)))
      : [];
    const shared = new Set(sharers.map((s) => s.duplicateOfId));
    const reps = await tx.select({ id: reports.id, storageKey: reports.storageKey, sha256: reports.sha256, sizeBytes: reports.sizeBytes }).from(reports).where(and(eq(reports.organisationId, member.organisationId), eq(reports.jobId, job.id)));
    const pkgs = await tx
      .select({ id: evidencePackages.id, storageKey: evidencePackages.storageKey, sha256: evidencePackages.sha256, sizeBytes: evidencePackages.sizeBytes, purpose: evidencePackages.purpose })
      .from(evidencePackages)
      .where(and(eq(evidencePackages.organisationId, member.organisationId), eq(evidencePackages.jobId, job.id)));
    const finals = pkgs.filter((p) => p.purpose === FINAL_PACKAGE_PURPOSE);
    const others = pkgs.filter((p) => p.purpose !== FINAL_PACKAGE_PURPOSE);

    const perRecording = new Map<string, DisposedFile[]>();
    const files: DisposedFile[] = [];
    for (const r of live) {
      const list: DisposedFile[] = [];
      if (r.storageKey && !shared.has(r.id)) list.push({ kind: "original", evidenceId: r.id, storageKey: r.storageKey, sha256: r.sha256, sizeBytes: r.sizeBytes });
      for (const d of rend.filter((x) => x.recordingId === r.id)) list.push({ kind: "rendition", evidenceId: d.id, storageKey: d.storageKey, sha256: d.sha256, sizeBytes: d.sizeBytes });
      for (const s of stl.filter((x) => x.recordingId === r.id && x.storageKey)) list.push({ kind: "still", evidenceId: s.id, storageKey: s.storageKey!, sha256: s.sha256, sizeBytes: null });
      perRecording.set(r.id, list);
      files.push(...list);
    }
    for (const rep of reps.filter((x) => x.storageKey)) files.push({ kind: "report", evidenceId: rep.id, storageKey: rep.storageKey!, sha256: rep.sha256, sizeBytes: rep.sizeBytes });
    for (const p of others.filter((x) => x.storageKey)) files.push({ kind: "evidence_package", evidenceId: p.id, storageKey: p.storageKey!, sha256: p.sha256, sizeBytes: p.sizeBytes });

    const [confirmer] = await tx.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, member.userId));
    const confirmedBy = { userId: member.userId, name: confirmer?.name ?? null, email: confirmer?.email ?? null, confirmedAt: now.toISOString() };
    if (liveIds.length) {
      await tx.update(recordings).set({ deletedAt: now, deletedBy: member.userId, updatedAt: now }).where(and(eq(recordings.organisationId, member.organisationId), inArray(recordings.id, liveIds)));
    }
    if (others.length) {
      await tx.update(evidencePackages).set({ state: "expired", updatedAt: now }).where(and(eq(evidencePackages.organisationId, member.organisationId), eq(evidencePackages.jobId, job.id), notInArray(evidencePackages.id, finals.length ? finals.map((f) => f.id) : ["00000000-0000-4000-8000-000000000000"])));
    }
    await tx.update(jobs).set({ disposedAt: now, disposedBy: member.userId, updatedAt: now }).where(eq(jobs.id, job.id));

    for (const r of live) {
      const list = perRecording.get(r.id)!;
      await recordCustodyEvent(
        {
          organisationId: member.organisationId,
          eventType: "disposal",
          evidenceType: "recording",
          evidenceId: r.id,
          jobId: job.id,
          originalSha256: r.sha256,
          originalSize: r.sizeBytes,
          actor: { userId: member.userId, role: member.role },
          ...facts,
          storageLocation: r.storageKey,
          purpose: `Retention ended (${retention.days} days from ${job.closedAt.toISOString().slice(0, 10)}, due ${date}): files destroyed`,
          details: { files: list.map(({ kind, evidenceId, sha256, sizeBytes, storageKey }) => ({ kind, evidenceId, sha256, sizeBytes, storageKey })), originalKept: shared.has(r.id), confirmedBy },
        },
        tx,
      );
    }
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: "disposal",
        evidenceType: "job",
        evidenceId: job.id,
        jobId: job.id,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        purpose: `Job disposed of at the end of its retention period (${retention.days} days, ${retention.source}); confirmed by ${confirmer?.name ?? member.userId}`,
        details: {
          closedAt: job.closedAt.toISOString(),
          retentionDays: retention.days,
          retentionSource: retention.source,
          disposalDate: date,
          recordings: live.length,
          files: files.map(({ kind, evidenceId, sha256, sizeBytes, storageKey }) => ({ kind, evidenceId, sha256, sizeBytes, storageKey })),
          keptFinalPackages: finals.map((f) => f.id),
          confirmedBy,
        },
      },
      tx,
    );
    const keys = [...files.map((f) => f.storageKey), ...live.map((r) => derivedFolderKey(member.organisationId, r.id))];
    return { held: false as const, keys, files, recordings: live.length, keptFinalPackages: finals.map((f) => f.id) };
  });
  if (outcome.held) return refuseHeld(member, outcome.job, facts);

  // files go after the commit: a failed transaction never leaves evidence half-destroyed
  for (const key of outcome.keys) {
    assertStoreKey(key); // refuses a key outside the store before anything is touched
    await removeKey(key);
  }
  return { jobId, disposedAt: now.toISOString(), recordings: outcome.recordings, files: outcome.files, keptFinalPackages: outcome.keptFinalPackages };
}
