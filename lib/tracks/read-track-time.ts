// Track times as GPX 1.1 writes them (xsd:dateTime, W3C XML Schema Part 2, section 3.2.7) and as the CSV
// column carries them (ISO 8601 date and time, with a space or a T between). A time without a zone is
// refused: the GPX 1.1 schema's documentation says its times are UTC, and a CSV time without a zone
// could be any of 24 hours off, so no distance computed from it could be trusted.

const DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2}):(\d{2})(?:\.(\d{1,9}))?(Z|[+-]\d{2}:\d{2})?$/;

export type TimeReading = { ok: true; ms: number } | { ok: false; reason: string };

/** Milliseconds since 1970-01-01T00:00:00Z (fractions past the millisecond are rounded). */
export function readTrackTime(text: string): TimeReading {
  const m = DATE_TIME.exec(text.trim());
  if (!m) return { ok: false, reason: `the time "${clip(text)}" is not a date and time like 2026-03-14T10:00:05Z` };
  const [, y, mo, d, h, mi, s, frac, zone] = m;
  if (!zone) return { ok: false, reason: `the time "${clip(text)}" has no time zone; write it in UTC with a Z (2026-03-14T10:00:05Z) or with its offset (+01:00)` };
  const month = Number(mo);
  const day = Number(d);
  const hour = Number(h);
  const minute = Number(mi);
  const second = Number(s);
  const daysInMonth = new Date(Date.UTC(Number(y), month, 0)).getUTCDate();
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth || hour > 23 || minute > 59 || second > 59) {
    return { ok: false, reason: `the time "${clip(text)}" is not a real date and time` };
  }
  let offsetMin = 0;
  if (zone !== "Z") {
    const sign = zone[0] === "-" ? -1 : 1;
    const [zh, zm] = zone.slice(1).split(":").map(Number);
    if (zh > 14 || zm > 59) return { ok: false, reason: `the time zone of "${clip(text)}" is not a real offset` };
    offsetMin = sign * (zh * 60 + zm);
  }
  const fracMs = frac ? Math.round(Number(`0.${frac}`) * 1000) : 0;
  const ms = Date.UTC(Number(y), month - 1, day, hour, minute, second) + fracMs - offsetMin * 60_000;
  return { ok: true, ms };
}

function clip(text: string): string {
  const t = text.trim();
  return t.length > 40 ? `${t.slice(0, 40)}…` : t;
}
