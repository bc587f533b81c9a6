// Creates a share link: checks that every target belongs to the job, stores the token's hash (never
// the token) and the passcode's bcrypt hash, records the "share" custody event in the same
// transaction, then mails the recipients. The token is returned once, to the sender, and forgotten.
import "server-only";
import { and, eq, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findings, jobs, recordings, reports, shareLinks } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { hashPassword } from "@/lib/auth/password";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { mailShareLink } from "@/lib/mail/mail-share-link";
import { generateShareToken, hashShareToken } from "./share-token";
import { shareLinkUrl } from "./share-link-url";
import { loadShareScope } from "./share-scope";
import type { ShareLinkInput } from "./share-link-input";
import type { AccessFacts } from "./record-share-access";

const DAY_MS = 24 * 3600 * 1000;

export type CreatedShareLink = { id: string; url: string; expiresAt: Date; mailed: string[]; mailError: string | null };

async function checkTargets(organisationId: string, input: ShareLinkInput): Promise<void> {
  const fields: Record<string, string[]> = {};
  if (input.scope === "recording" && input.recordingId) {
    const [r] = await db()
      .select({ id: recordings.id })
      .from(recordings)
      .where(and(eq(recordings.id, input.recordingId), eq(recordings.organisationId, organisationId), eq(recordings.jobId, input.jobId), isNull(recordings.deletedAt)));
    if (!r) fields.recordingId = ["That recording is not part of this job"];
  }
  if (input.scope === "findings" && input.findingIds?.length) {
    const ids = [...new Set(input.findingIds)];
    const rows = await db()
      .select({ id: findings.id })
      .from(findings)
      .where(and(inArray(findings.id, ids), eq(findings.organisationId, organisationId), eq(findings.jobId, input.jobId), isNull(findings.deletedAt)));
    if (rows.length !== ids.length) fields.findingIds = ["Some of those findings are not part of this job"];
  }
  if (input.reportId) {
    const [r] = await db()
      .select({ id: reports.id, state: reports.state, version: reports.version })
      .from(reports)
      .where(and(eq(reports.id, input.reportId), eq(reports.organisationId, organisationId), eq(reports.jobId, input.jobId)));
    // only an approved version leaves the organisation: a draft could be read as the final word
    if (!r) fields.reportId = ["That report version is not part of this job"];
    else if (r.state !== "approved") fields.reportId = [`Version ${r.version} is not approved; only an approved report version can be shared`];
  }
  if (Object.keys(fields).length) throw new ApiError("unprocessable", "Some of the shared items are not available", fields);
}

export async function createShareLink(member: Member, input: ShareLinkInput, facts: AccessFacts, now = new Date()): Promise<CreatedShareLink> {
  const [job] = await db()
    .select({ id: jobs.id, title: jobs.title })
    .from(jobs)
    .where(and(eq(jobs.id, input.jobId), eq(jobs.organisationId, member.organisationId)));
  if (!job) throw notFound("Job not found");
  await checkTargets(member.organisationId, input);

  const token = generateShareToken();
  const expiresAt = new Date(now.getTime() + input.expiresInDays * DAY_MS);
  const passcodeHash = input.passcode ? await hashPassword(input.passcode) : null;
  const recipients = [...new Set(input.recipientEmails)];
  const findingIds = input.scope === "findings" ? [...new Set(input.findingIds ?? [])] : null;

  const link = await db().transaction(async (tx) => {
    const [row] = await tx
      .insert(shareLinks)
      .values({
        organisationId: member.organisationId,
        jobId: job.id,
        scope: input.scope,
        recordingId: input.scope === "recording" ? input.recordingId! : null,
        findingIds,
        reportId: input.reportId ?? null,
        tokenHash: hashShareToken(token),
        label: input.label,
        recipientEmails: recipients,
        expiresAt,
        passcodeHash,
        allowOriginals: input.scope === "report" ? false : input.allowOriginals,
        createdBy: member.userId,
      })
      .returning({ id: shareLinks.id, expiresAt: shareLinks.expiresAt, scope: shareLinks.scope, allowOriginals: shareLinks.allowOriginals });
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: "share",
        evidenceType: "share_link",
        evidenceId: row.id,
        jobId: job.id,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        purpose: `Shared with a client: ${input.label}`,
        details: {
          scope: row.scope,
          recordingId: input.scope === "recording" ? input.recordingId : null,
          findingIds,
          reportId: input.reportId ?? null,
          allowOriginals: row.allowOriginals,
          passcode: passcodeHash !== null,
          expiresAt: row.expiresAt.toISOString(),
          recipients,
        },
      },
      tx,
    );
    return row;
  });

  const url = shareLinkUrl(token);
  let mailError: string | null = null;
  let mailed: string[] = [];
  if (input.sendMail && recipients.length) {
    try {
      const contents = await loadShareScope({
        id: link.id,
        organisationId: member.organisationId,
        jobId: job.id,
        scope: link.scope,
        recordingId: input.scope === "recording" ? input.recordingId! : null,
        findingIds,
        reportId: input.reportId ?? null,
        allowOriginals: link.allowOriginals,
      });
      await mailShareLink({
        contains: { recordings: contents.recordings.length, findings: contents.findings.length, report: contents.report !== null },
        to: recipients,
        url,
        expiresAt: link.expiresAt,
        organisationName: member.organisationName,
        senderName: member.name,
        jobTitle: job.title,
        label: input.label,
        hasPasscode: passcodeHash !== null,
      });
      mailed = recipients;
    } catch (err) {
      // the link exists either way; the sender can copy it and send it another way
      mailError = "The mail could not be sent. Copy the link and send it yourself.";
      console.error("[cairn] share link mail failed:", (err as Error).message);
    }
  }
  return { id: link.id, url, expiresAt: link.expiresAt, mailed, mailError };
}
