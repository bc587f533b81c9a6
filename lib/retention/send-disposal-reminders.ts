// Reminds an organisation's owners that a closed job's evidence falls due for disposal: 30 and 7 days
// ahead and on the day. Each reminder is sent once per job, disposal date and lead: a row in
// disposal_reminders (unique on the three) is claimed before the mail goes out and given back if
// sending fails, so a retry sends it then; the mail itself also goes through sendOnce
// (lib/mail/send-once.ts). When the job is found late, only the nearest lead that has opened is sent
// (a job found 5 days ahead gets the 7-day reminder, not also the 30-day one). A job under legal hold
// is not disposed of while the hold lasts, so it gets no reminder. Never destroys anything.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { disposalReminders, memberships, users } from "@/db/schema";
import { env } from "@/lib/config/env";
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import { sendOnce } from "@/lib/mail/send-once";
import { listDisposals, type DisposalItem } from "./list-disposals";

export const REMINDER_LEAD_DAYS = [30, 7, 0] as const;

export type ReminderOutcome = { jobId: string; leadDays: number; to: string[] };

/** The lead whose reminder is due now: the smallest lead not below the days left, or none yet. */
export function leadDue(daysLeft: number, leads: readonly number[] = REMINDER_LEAD_DAYS): number | null {
  const open = leads.filter((l) => daysLeft <= l);
  return open.length ? Math.min(...open) : null;
}

export const disposalPageUrl = () => `${env().APP_URL.replace(/\/+$/, "")}/disposal`;

function reminderMail(item: DisposalItem, leadDays: number) {
  const when = leadDays === 0 ? (item.daysLeft < 0 ? `has been due since ${item.disposalDate}` : `is due today, ${item.disposalDate}`) : `falls due on ${item.disposalDate} (UTC), in ${item.daysLeft} day${item.daysLeft === 1 ? "" : "s"}`;
  return {
    subject: leadDays === 0 ? `Due for disposal: ${item.title}` : `Disposal in ${item.daysLeft} days: ${item.title}`,
    ...composeMail(
      [
        `The evidence of "${item.title}" (${item.clientName}, ${item.siteName}) ${when}.`,
        `It was closed on ${item.closedAt.slice(0, 10)} and is kept for ${item.retentionDays} days.`,
        "Nothing is destroyed until an owner confirms the disposal in Cairn. Before that you can build a final evidence package, place a legal hold, or set a longer period on the job.",
      ],
      { label: "Open the disposal list", url: disposalPageUrl() },
    ),
  };
}

export async function sendDisposalReminders(now: Date, opts: { organisationId?: string } = {}): Promise<ReminderOutcome[]> {
  const items = await listDisposals({ organisationId: opts.organisationId, horizonDays: Math.max(...REMINDER_LEAD_DAYS) }, now);
  const out: ReminderOutcome[] = [];
  for (const item of items) {
    if (item.legalHold) continue;
    const lead = leadDue(item.daysLeft);
    if (lead === null) continue;
    const owners = await db()
      .select({ email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.organisationId, item.organisationId), eq(memberships.role, "owner")));
    const to = owners.map((o) => o.email).sort();
    if (to.length === 0) continue;
    const [claimed] = await db()
      .insert(disposalReminders)
      .values({ organisationId: item.organisationId, jobId: item.jobId, disposalDate: item.disposalDate, leadDays: lead, recipients: to, sentAt: now })
      .onConflictDoNothing()
      .returning({ id: disposalReminders.id });
    if (!claimed) continue;
    try {
      await sendOnce(`disposal-reminder:${item.jobId}:${item.disposalDate}:${lead}`, () => sendMail({ to, ...reminderMail(item, lead) }));
      out.push({ jobId: item.jobId, leadDays: lead, to });
    } catch (err) {
      await db().delete(disposalReminders).where(eq(disposalReminders.id, claimed.id)).catch(() => {});
      console.error(`[retention] reminder for job ${item.jobId} not sent: ${(err as Error).message}`);
    }
  }
  return out;
}
