// Puts a job under legal hold or releases it. While held, none of the job's originals or derived
// files may be deleted. Setting or releasing is itself a custody event, and each needs a reason
// (lib/validation/legal-hold.ts), written into the event's purpose.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, type RequestFacts } from "./record-custody-event";

export type LegalHold = { jobId: string; legalHold: boolean; legalHoldReason: string | null };

export async function getLegalHold(organisationId: string, jobId: string): Promise<LegalHold> {
  const [job] = await db()
    .select({ jobId: jobs.id, legalHold: jobs.legalHold, legalHoldReason: jobs.legalHoldReason })
    .from(jobs)
    .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  if (!job) throw notFound("Job not found");
  return job;
}

export async function setLegalHold(
  member: Member,
  jobId: string,
  input: { hold: boolean; reason: string },
  facts: RequestFacts,
): Promise<LegalHold> {
  const reason = input.reason.trim();
  if (!reason)
    throw new ApiError("unprocessable", input.hold ? "Say why the job is held" : "Say why the hold is released", {
      reason: [input.hold ? "Give the reason for the hold (case, claim or request reference)" : "Say why the hold is released"],
    });
  return db().transaction(async (tx) => {
    const [job] = await tx
      .select({ id: jobs.id, legalHold: jobs.legalHold, legalHoldReason: jobs.legalHoldReason })
      .from(jobs)
      .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, member.organisationId)))
      .for("update");
    if (!job) throw notFound("Job not found");
    if (job.legalHold === input.hold && (!input.hold || job.legalHoldReason === reason)) {
      return { jobId: job.id, legalHold: job.legalHold, legalHoldReason: job.legalHoldReason };
    }
    const [row] = await tx
      .update(jobs)
      .set({ legalHold: input.hold, legalHoldReason: input.hold ? reason : null, updatedAt: new Date() })
      .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, member.organisationId)))
      .returning({ jobId: jobs.id, legalHold: jobs.legalHold, legalHoldReason: jobs.legalHoldReason });
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: input.hold ? "hold_set" : "hold_released",
        evidenceType: "job",
        evidenceId: jobId,
        jobId,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        purpose: input.hold ? `Legal hold: ${reason}` : `Legal hold released: ${reason}`,
        details: input.hold ? { previousReason: job.legalHoldReason } : { previousReason: job.legalHoldReason, releaseReason: reason },
      },
      tx,
    );
    return row;
  });
}
