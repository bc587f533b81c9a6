// Altitudes above ground as people read them: in their own unit first, the other in brackets,
// always with the unit written (docs/look.md).
import { formatLength, fromMetres } from "@/lib/geo/units";
import { altitudeCautions } from "@/lib/geo/cautions";

export type AltitudeUnit = "ft" | "m";

export function formatAltitude(metres: number, unit: AltitudeUnit): { primary: string; secondary: string } {
  const other: AltitudeUnit = unit === "ft" ? "m" : "ft";
  return {
    primary: `${formatLength({ value: fromMetres(metres, unit), unit }, 0)} AGL`,
    secondary: formatLength({ value: fromMetres(metres, other), unit: other }, 0),
  };
}

/** The altitude cautions to show, or none when the height is within the common limit. */
export function altitudeCautionsToShow(metres: number | null | undefined) {
  if (metres == null || !Number.isFinite(metres)) return [];
  const list = altitudeCautions(metres);
  return list.some((c) => c.id === "altitude-limit") ? list : [];
}
