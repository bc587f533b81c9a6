// Validation of range checks: the same schemas check the form in the browser and the body on the server.
// Lengths arrive in the unit the pilot typed them in (ft or m) and leave in metres, converted with the
// exact factors of lib/geo; coordinates arrive as text in decimal degrees or DMS and leave as numbers.
import { z } from "zod";
import { GeoInputError, fromMetres, parseAngle, toMetres, type Axis } from "@/lib/geo";
import { LINK_EVENTS, type LinkEvent } from "@/lib/range-checks/link-events";
import { CHART_DIMENSIONS } from "@/lib/range-checks/aggregate-range-chart";
import type { PositionInput } from "@/lib/range-checks/compute-range-check";
import { optionalText, optionalUuid, textRule, uuid } from "./common";

export const LENGTH_UNITS = ["ft", "m"] as const;
export type DisplayUnits = (typeof LENGTH_UNITS)[number];
export const POSITION_BY = ["coordinates", "distance"] as const;

// Bounds well past any small-drone flight, there only to catch typing slips (an extra zero, feet in a metres field).
export const MAX_HEIGHT_AGL_M = 10_000;
export const MAX_GROUND_DISTANCE_M = 200_000; // 200 km
export const MAX_AT_SEC = 24 * 3600; // 24 h into one recording

/** A number typed into a form (text) or sent as JSON (number); empty means "not given". */
const typedNumber = (what: string) =>
  z.preprocess(
    (v) => (v === "" || v === undefined || v === null ? null : typeof v === "string" ? (v.trim() === "" ? null : Number(v.trim())) : v),
    z.number({ message: `${what} must be a number, e.g. 1926 or 587.1` }).finite(`${what} must be a number, e.g. 1926 or 587.1`).nullable(),
  );

/** Coordinates stay text until the whole body is known: DMS and hemisphere letters are read by lib/geo. */
const angleText = z.preprocess(
  (v) => (v === undefined || v === null ? null : typeof v === "number" ? String(v) : v),
  z.string({ message: "Write the coordinate as text or a number, e.g. 54.41 or 54°24'36\"N" }).superRefine(textRule()).trim().max(60, "At most 60 characters").nullable(),
);

const orientation = optionalText(80);

/** The fields a pilot fills in, as they arrive; nothing here is converted yet. */
export const rangeCheckFields = {
  event: z.enum(LINK_EVENTS, { message: "Choose picture breaking up, video lost or video back" }),
  atSec: typedNumber("Time into the recording"),
  recordingId: optionalUuid,
  positionBy: z.enum(POSITION_BY, { message: "Choose coordinates, or ground distance and bearing" }),
  latitude: angleText,
  longitude: angleText,
  groundDistance: typedNumber("Ground distance"),
  bearingDeg: typedNumber("Bearing"),
  heightAgl: typedNumber("Height above ground"),
  units: z.enum(LENGTH_UNITS, { message: "Choose ft or m" }).optional(),
  antennaOrientation: orientation,
  cameraOrientation: orientation,
  aircraft: optionalText(120),
  firmware: optionalText(80),
  notes: optionalText(2000, true),
};

type RawFields = {
  event: LinkEvent;
  atSec: number | null;
  recordingId: string | null;
  positionBy: (typeof POSITION_BY)[number];
  latitude: string | null;
  longitude: string | null;
  groundDistance: number | null;
  bearingDeg: number | null;
  heightAgl: number | null;
  units?: DisplayUnits;
  antennaOrientation: string | null;
  cameraOrientation: string | null;
  aircraft: string | null;
  firmware: string | null;
  notes: string | null;
};

/** What the server computes from: every length in metres, the position in one of its two forms. */
export type RangeCheckValues = {
  event: LinkEvent;
  atSec: number | null;
  recordingId: string | null;
  position: PositionInput;
  heightAglM: number;
  antennaOrientation: string | null;
  cameraOrientation: string | null;
  aircraft: string | null;
  firmware: string | null;
  notes: string | null;
};

const lengthLimit = (limitM: number, units: DisplayUnits) =>
  units === "m" ? `${limitM.toLocaleString("en-US")} m` : `${Math.floor(fromMetres(limitM, "ft")).toLocaleString("en-US")} ft`;

/** Converts and cross-checks the raw fields; every problem becomes an issue on the field that caused it. */
function toValues(v: RawFields, ctx: z.RefinementCtx): RangeCheckValues | null {
  const units = v.units ?? "m";
  let failed = false;
  const issue = (field: string, message: string) => {
    failed = true;
    ctx.addIssue({ code: "custom", path: [field], message });
  };

  if (v.atSec !== null && (v.atSec < 0 || v.atSec > MAX_AT_SEC)) issue("atSec", `Time into the recording must be between 0 and ${MAX_AT_SEC} s`);

  let heightAglM = 0;
  if (v.heightAgl === null) issue("heightAgl", "Give the height above ground level");
  else if (v.heightAgl < 0) issue("heightAgl", "Height above ground cannot be negative");
  else {
    heightAglM = toMetres(v.heightAgl, units);
    if (heightAglM > MAX_HEIGHT_AGL_M) issue("heightAgl", `Height above ground must be at most ${lengthLimit(MAX_HEIGHT_AGL_M, units)}`);
  }

  let position: PositionInput | null = null;
  if (v.positionBy === "coordinates") {
    const read = (field: "latitude" | "longitude", axis: Axis) => {
      const text = v[field];
      if (!text) {
        issue(field, `Give the ${axis}, e.g. ${axis === "latitude" ? "54.41 or 54°24'36\"N" : "-2.62 or 2°37'12\"W"}`);
        return null;
      }
      try {
        return parseAngle(text, axis, field);
      } catch (err) {
        if (err instanceof GeoInputError) {
          issue(field, err.message);
          return null;
        }
        throw err;
      }
    };
    const latitude = read("latitude", "latitude");
    const longitude = read("longitude", "longitude");
    if (latitude !== null && longitude !== null) position = { by: "coordinates", latitude, longitude };
  } else {
    let groundDistanceM: number | null = null;
    if (v.groundDistance === null) issue("groundDistance", "Give the ground distance from the launch point");
    else if (v.groundDistance < 0) issue("groundDistance", "Ground distance cannot be negative");
    else {
      groundDistanceM = toMetres(v.groundDistance, units);
      if (groundDistanceM > MAX_GROUND_DISTANCE_M) {
        issue("groundDistance", `Ground distance must be at most ${lengthLimit(MAX_GROUND_DISTANCE_M, units)}`);
        groundDistanceM = null;
      }
    }
    let bearingOk = true;
    if (v.bearingDeg !== null && (v.bearingDeg < 0 || v.bearingDeg > 360)) {
      issue("bearingDeg", "Bearing must be between 0 and 360 degrees (clockwise from true north)");
      bearingOk = false;
    }
    if (groundDistanceM !== null && bearingOk) position = { by: "distance", groundDistanceM, bearingDeg: v.bearingDeg };
  }

  if (!position || failed) return null;
  return {
    event: v.event,
    atSec: v.atSec,
    recordingId: v.recordingId,
    position,
    heightAglM,
    antennaOrientation: v.antennaOrientation,
    cameraOrientation: v.cameraOrientation,
    aircraft: v.aircraft,
    firmware: v.firmware,
    notes: v.notes,
  };
}

const fieldsObject = z.object(rangeCheckFields);

/** POST /api/range-checks */
export const rangeCheckCreateInput = fieldsObject
  .extend({ flightId: uuid })
  .transform((v, ctx) => {
    const values = toValues(v, ctx);
    return values ? { flightId: v.flightId, ...values } : z.NEVER;
  });

/** The fields of a range check without the flight: what PATCH checks after merging with the stored row. */
export const rangeCheckValuesInput = fieldsObject.transform((v, ctx) => toValues(v, ctx) ?? z.NEVER);

/**
 * PATCH /api/range-checks/:id: any subset of the fields. Unknown keys are refused so a misspelt
 * field is an error, not a silent no-op. The flight of a range check never changes.
 */
export const rangeCheckPatchInput = fieldsObject.partial().strict();

/**
 * POST /api/range-checks/from-trace: the event and its time come from the signal trace, not the body;
 * the pilot confirms the position and height.
 */
export const rangeCheckFromTraceInput = fieldsObject
  .omit({ event: true, atSec: true, recordingId: true })
  .extend({
    flightId: uuid,
    recordingId: uuid,
    intervalIndex: z.preprocess(
      (v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v),
      z.number({ message: "Choose an interval of the signal trace" }).int("Choose an interval of the signal trace").min(0, "Choose an interval of the signal trace"),
    ),
  })
  .transform((v, ctx) => {
    // the placeholder event is replaced by the one the trace interval marks
    const values = toValues({ ...v, event: "first_degradation", atSec: null, recordingId: v.recordingId }, ctx);
    if (!values) return z.NEVER;
    const { event: _e, atSec: _a, ...rest } = values;
    return { ...rest, flightId: v.flightId, recordingId: v.recordingId, intervalIndex: v.intervalIndex };
  });

export type RangeCheckCreateInput = z.infer<typeof rangeCheckCreateInput>;
export type RangeCheckPatchInput = z.infer<typeof rangeCheckPatchInput>;
export type RangeCheckFromTraceInput = z.infer<typeof rangeCheckFromTraceInput>;
/** What the form holds before parsing. */
export type RangeCheckFormInput = z.input<typeof fieldsObject>;

/** PATCH /api/users/me/preferences */
export const preferencesInput = z.object({ preferredUnits: z.enum(LENGTH_UNITS, { message: "Choose ft or m" }) }).strict();

/** ?flightId= on the list, chart, trace-event and export endpoints; absent means every flight. */
export const flightFilter = z.object({
  flightId: z
    .union([z.literal(""), z.string().uuid("Choose a flight from the list")])
    .optional()
    .transform((v) => (v ? v : undefined)),
});

/** GET /api/range-checks/trace-events?flightId= */
export const traceEventsQuery = z.object({ flightId: z.string().uuid("Choose a flight from the list") });
/** GET /api/range-checks/chart?flightId=&by= */
export const rangeChartQuery = flightFilter.extend({ by: z.enum(CHART_DIMENSIONS, { message: "Compare by camera orientation, antenna orientation, aircraft or site" }).default("cameraOrientation") });
