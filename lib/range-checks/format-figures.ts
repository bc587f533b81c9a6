import { formatDecimalDegrees, formatLength, fromMetres, toMetres, type LengthUnit } from "@/lib/geo";

/** A stored length (metres) in the reader's unit, always with the unit written. */
export function formatMetresIn(metres: number, units: LengthUnit, precision = 1): string {
  return formatLength({ value: fromMetres(metres, units), unit: units }, precision);
}

/** Bearings as pilots read them: degrees clockwise from true north, one decimal. */
export function formatBearing(deg: number): string {
  return `${deg.toFixed(1)}° true`;
}

export function formatSeconds(sec: number): string {
  return `${sec.toFixed(2)} s`;
}

export function formatLatLon(lat: number, lon: number): string {
  return `${formatDecimalDegrees(lat, 6)}, ${formatDecimalDegrees(lon, 6)}`;
}

/** A typed number carried across a units switch: exact conversion, then at most 3 decimals for the field. */
export function convertTypedLength(text: string, from: LengthUnit, to: LengthUnit): string {
  const trimmed = text.trim();
  if (trimmed === "" || from === to) return text;
  const value = Number(trimmed);
  if (!Number.isFinite(value)) return text;
  const converted = fromMetres(toMetres(value, from), to);
  return String(Number(converted.toFixed(3)));
}
