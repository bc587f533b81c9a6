import { GeoInputError, requireFinite } from "./geo-input-error";

/**
 * Length units and exact conversions.
 *
 * The defining values are exact by international agreement (1959 international yard and pound agreement;
 * NIST SP 811, Appendix B): 1 ft = 0.3048 m, 1 mi (international/statute) = 1609.344 m, 1 nmi = 1852 m.
 * They are kept as integer ratios (3048 / 10000, 1609344 / 1000) so that whole-number inputs convert with a
 * single rounding: 400 * 0.3048 happens to land on 121.92, but other products of a binary fraction do not.
 */

export type LengthUnit = "m" | "km" | "ft" | "mi" | "nmi";

export type Length = { readonly value: number; readonly unit: LengthUnit };

/** Metres per unit as an exact ratio numerator / denominator. */
const METRES_PER_UNIT: Record<LengthUnit, { readonly num: number; readonly den: number }> = {
  m: { num: 1, den: 1 },
  km: { num: 1000, den: 1 },
  ft: { num: 3048, den: 10000 }, // 0.3048 m exactly
  mi: { num: 1609344, den: 1000 }, // 1609.344 m exactly
  nmi: { num: 1852, den: 1 }, // 1852 m exactly
};

/** Exposed for display ("1 ft = 0.3048 m") and for tests; use the functions for arithmetic. */
export const METRES_PER_FOOT = 0.3048;
export const METRES_PER_STATUTE_MILE = 1609.344;
export const METRES_PER_NAUTICAL_MILE = 1852;

export function toMetres(value: number, unit: LengthUnit): number {
  const { num, den } = METRES_PER_UNIT[unit];
  return (value * num) / den;
}

export function fromMetres(metres: number, unit: LengthUnit): number {
  const { num, den } = METRES_PER_UNIT[unit];
  return (metres * den) / num;
}

export function convertLength(length: Length, to: LengthUnit): Length {
  if (length.unit === to) return length;
  return { value: fromMetres(toMetres(length.value, length.unit), to), unit: to };
}

export const feetToMetres = (feet: number): number => toMetres(feet, "ft");
export const metresToFeet = (metres: number): number => fromMetres(metres, "ft");
export const statuteMilesToMetres = (miles: number): number => toMetres(miles, "mi");
export const metresToStatuteMiles = (metres: number): number => fromMetres(metres, "mi");
export const nauticalMilesToMetres = (nmi: number): number => toMetres(nmi, "nmi");
export const metresToNauticalMiles = (metres: number): number => fromMetres(metres, "nmi");

const MAX_PRECISION = 10;

/**
 * Writes a length with its unit, always: a bare "1967" on a tablet in the field invites the wrong unit.
 * `precision` is the number of decimals; the grouping follows `locale` (default en-US, "1,967.1 ft").
 */
export function formatLength(length: Length, precision = 1, locale = "en-US"): string {
  requireFinite("value", length.value);
  if (!Number.isInteger(precision) || precision < 0 || precision > MAX_PRECISION) {
    throw new GeoInputError("precision", `precision must be a whole number from 0 to ${MAX_PRECISION}, got ${precision}.`);
  }
  const text = new Intl.NumberFormat(locale, {
    minimumFractionDigits: precision,
    maximumFractionDigits: precision,
    // A figure that rounds to zero should not read "-0.0 ft".
    signDisplay: "negative",
  }).format(length.value);
  return `${text} ${length.unit}`;
}
