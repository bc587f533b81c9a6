// How long a closed job's evidence is kept: the job's own period if set, else its client's, else the
// organisation's default (ours: the most specific agreement wins). The disposal date is the calendar
// date (UTC) of the closing plus that many days; the job falls due at the start of that day, UTC.
// Dates are UTC throughout because reminders are read anywhere (docs/look.md, "Dates and times").

export const MAX_RETENTION_DAYS = 36_500; // 100 years
export const DAY_MS = 86_400_000;

export type RetentionSource = "job" | "client" | "organisation";
export type EffectiveRetention = { days: number; source: RetentionSource };

export function effectiveRetention(jobDays: number | null, clientDays: number | null, organisationDays: number | null): EffectiveRetention | null {
  if (jobDays != null) return { days: jobDays, source: "job" };
  if (clientDays != null) return { days: clientDays, source: "client" };
  if (organisationDays != null) return { days: organisationDays, source: "organisation" };
  return null;
}

/** UTC midnight of a moment's calendar date. */
export const utcDay = (d: Date) => new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));

/** The disposal date, YYYY-MM-DD: the closing's UTC calendar date plus `days` days. */
export function disposalDate(closedAt: Date, days: number): string {
  if (!Number.isInteger(days) || days < 0) throw new RangeError(`retention must be a whole number of days, got ${days}`);
  return new Date(utcDay(closedAt).getTime() + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `now`'s UTC date to the disposal date: 0 on the day, negative once past. */
export function daysUntil(date: string, now: Date): number {
  return Math.round((Date.parse(`${date}T00:00:00Z`) - utcDay(now).getTime()) / DAY_MS);
}

export const isDue = (date: string, now: Date) => daysUntil(date, now) <= 0;

export const RETENTION_SOURCE_WORDS: Record<RetentionSource, string> = {
  job: "set on the job",
  client: "the client's period",
  organisation: "the organisation's default",
};
