// Calendar dates in a site's time zone, written as ISO 8601 (docs/look.md: "2026-03-14").
import type { JobStatus } from "@/lib/validation/work";

/** The calendar date of an instant in a time zone, as YYYY-MM-DD. */
export function isoDateIn(instant: Date | string | number, timeZone: string): string {
  const parts = new Intl.DateTimeFormat("en-US", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).formatToParts(new Date(instant));
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

const OPEN: readonly JobStatus[] = ["planned", "fieldwork", "review"];

/** A job is overdue when its due date has passed at the site and the work is still open. */
export function isOverdue(dueDate: string | null, status: JobStatus, timeZone: string, now: Date = new Date()): boolean {
  if (!dueDate || !OPEN.includes(status)) return false;
  return dueDate < isoDateIn(now, timeZone);
}
