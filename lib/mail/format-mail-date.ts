// Dates in mail: ISO 8601 day and time in UTC, stated as such (docs/look.md: ISO dates; a mail reader's time
// zone is unknown to us).
export function formatMailDate(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}
