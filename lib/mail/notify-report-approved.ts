// Tells the job's crew (and the report's author) that a report version was approved, with a link
// to the job. One mail per approved version, however often this is called. Never throws.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, organisations, reports, users } from "@/db/schema";
import { env } from "@/lib/config/env";
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import { jobCrew } from "./job-crew";
import { sendOnce } from "./send-once";
import type { NotifyResult } from "./notify-processing-finished";

export const jobPageUrl = (jobId: string) => `${env().APP_URL.replace(/\/+$/, "")}/jobs/${jobId}`;

export async function notifyReportApproved(reportId: string): Promise<NotifyResult> {
  try {
    const [rep] = await db()
      .select({
        id: reports.id,
        organisationId: reports.organisationId,
        jobId: reports.jobId,
        version: reports.version,
        state: reports.state,
        createdBy: reports.createdBy,
        approvedBy: reports.approvedBy,
        approvedAt: reports.approvedAt,
        jobTitle: jobs.title,
        organisationName: organisations.name,
      })
      .from(reports)
      .innerJoin(jobs, and(eq(jobs.id, reports.jobId), eq(jobs.organisationId, reports.organisationId)))
      .innerJoin(organisations, eq(organisations.id, reports.organisationId))
      .where(eq(reports.id, reportId));
    if (!rep) return { sent: [], skipped: "no such report" };
    if (rep.state !== "approved") return { sent: [], skipped: `report is ${rep.state}` };
    const [approver] = rep.approvedBy ? await db().select({ name: users.name }).from(users).where(eq(users.id, rep.approvedBy)) : [];
    const crew = await jobCrew(rep.organisationId, rep.jobId, [rep.createdBy]);
    if (crew.length === 0) return { sent: [], skipped: "no crew to tell" };
    const paragraphs = [
      `Report version ${rep.version} of "${rep.jobTitle}" was approved${approver ? ` by ${approver.name}` : ""}${rep.approvedAt ? ` on ${rep.approvedAt.toISOString().slice(0, 10)}` : ""}.`,
      "It can now be shared with the client from the job page.",
      rep.organisationName,
    ];
    const outcome = await sendOnce(`report-approved:${rep.id}`, () =>
      sendMail({ to: crew.map((c) => c.email), subject: `Report approved: ${rep.jobTitle} (version ${rep.version})`, ...composeMail(paragraphs, { label: "Open the job", url: jobPageUrl(rep.jobId) }) }),
    );
    return outcome === "sent" ? { sent: crew.map((c) => c.email) } : { sent: [], skipped: "already sent" };
  } catch (err) {
    console.error("[cairn] report notification failed:", (err as Error).message);
    return { sent: [], error: (err as Error).message };
  }
}
