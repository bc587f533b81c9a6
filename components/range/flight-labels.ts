// Flight pickers list flights by date and job; several flights of one job on one day read the same.
// Each gets its site, then "flight n of the day" (in the order they were logged) when the day has
// more than one, and the aircraft when known, so every label in a list is different.
export type LabelledFlight = { id: string; flownOn: string; jobTitle: string; siteName: string; aircraft: string | null };

/**
 * Labels for a list of flights, in the list's order. `flights` must list the flights of one job and
 * day in the order they were logged (load-range-page-data.ts orders by date, job, then creation).
 */
export function labelFlights<T extends LabelledFlight>(flights: T[]): Map<string, string> {
  const sameDay = new Map<string, T[]>();
  for (const f of flights) {
    const key = `${f.flownOn}\u0000${f.jobTitle}\u0000${f.siteName}`;
    sameDay.set(key, [...(sameDay.get(key) ?? []), f]);
  }
  const labels = new Map<string, string>();
  for (const group of sameDay.values()) {
    group.forEach((f, i) => {
      const parts = [f.flownOn, f.jobTitle, f.siteName];
      if (group.length > 1) parts.push(`flight ${i + 1} of ${group.length} that day`);
      if (f.aircraft) parts.push(f.aircraft);
      labels.set(f.id, parts.join(" · "));
    });
  }
  // two flights the same in everything above (same job, site, day and aircraft cannot happen: the
  // day's number tells them apart); a label could still repeat across two jobs of the same title at
  // the same site, so the last resort is the flight's short id
  const seen = new Map<string, number>();
  for (const l of labels.values()) seen.set(l, (seen.get(l) ?? 0) + 1);
  for (const [id, l] of labels) if ((seen.get(l) ?? 0) > 1) labels.set(id, `${l} · ${id.slice(0, 8)}`);
  return labels;
}
