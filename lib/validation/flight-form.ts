// The flight form works in the member's own length unit; the API stores metres. This schema is the
// API's flight schema with the altitude in the form's unit, and the conversion back is exact
// (lib/geo/units.ts: 1 ft = 0.3048 m).
import { z } from "zod";
import { fromMetres, toMetres } from "@/lib/geo/units";
import { optionalNumber } from "./common";
import { FLIGHT_LAUNCH_PAIR, MAX_ALTITUDE_AGL_M, coordinatePairIssue, flightFields, type FlightInput } from "./work";

export type AltitudeUnit = "ft" | "m";

export function flightForm(unit: AltitudeUnit) {
  const { maxAltitudeAglM: _m, ...rest } = flightFields;
  return z
    .object({ ...rest, maxAltitude: optionalNumber(0, Math.floor(fromMetres(MAX_ALTITUDE_AGL_M, unit)), "Max altitude") })
    .superRefine((v, ctx) => {
      const issue = coordinatePairIssue(v.launchLatitude, v.launchLongitude, FLIGHT_LAUNCH_PAIR);
      if (issue) ctx.addIssue({ code: "custom", path: [issue.field], message: issue.message });
    });
}
export type FlightFormValues = z.output<ReturnType<typeof flightForm>>;

/**
 * What the form sends. `unchangedAltitudeM` is the stored altitude when the field was not edited, so that
 * saving a flight without touching the altitude never shifts it by a rounding of the displayed figure.
 */
export function flightFormToInput(values: FlightFormValues, unit: AltitudeUnit, unchangedAltitudeM?: number | null): FlightInput {
  const { maxAltitude, ...rest } = values;
  const maxAltitudeAglM = unchangedAltitudeM !== undefined ? unchangedAltitudeM : maxAltitude == null ? null : toMetres(maxAltitude, unit);
  return { ...rest, maxAltitudeAglM };
}

/** The stored metres written in the form's unit, rounded to what a person types (0.1). */
export function altitudeForForm(metres: number | null | undefined, unit: AltitudeUnit): string {
  if (metres == null) return "";
  return String(Math.round(fromMetres(metres, unit) * 10) / 10);
}
