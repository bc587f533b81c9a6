// Range checks of the organisation's flights: list, read, create, edit, archive. The slant range and
// the derived half of the position are always computed here, on the server, from the stored inputs.
import "server-only";
import { and, eq, isNull, type SQL, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, linkEventEnum, rangeChecks, recordings } from "@/db/schema";
import type { SelectedFields } from "drizzle-orm/pg-core";
import { ApiError, notFound } from "@/lib/api/errors";
import { keysetOf, keysetPage, listWhere, type ListParams } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, countUpTo } from "@/lib/api/keyset";
import type { Member } from "@/lib/auth/load-member";
import { GeoInputError, fromMetres } from "@/lib/geo";
import { rangeCheckValuesInput, type DisplayUnits, type RangeCheckCreateInput, type RangeCheckPatchInput, type RangeCheckValues } from "@/lib/validation/range-checks";
import { computeRangeCheckFigures, type RangeCheckFigures } from "./compute-range-check";
import { getRangeCheckFlightOrThrow, requireRecordingOfFlight, type RangeCheckFlight } from "./flight-for-range-check";
import { rangeCheckMeasureColumns } from "./range-check-measures";

export const rangeCheckColumns = {
  id: rangeChecks.id,
  flightId: rangeChecks.flightId,
  recordingId: rangeChecks.recordingId,
  recordingName: recordings.originalName,
  flownOn: flights.flownOn,
  ...rangeCheckMeasureColumns,
  archivedAt: rangeChecks.archivedAt,
  createdAt: rangeChecks.createdAt,
  updatedAt: rangeChecks.updatedAt,
};

/** Range checks with their flight and recording names; `extra` adds columns (a list's total). */
function selectRangeChecks<X extends SelectedFields = Record<never, never>>(extra?: X) {
  return db()
    .select({ ...rangeCheckColumns, ...(extra as X) })
    .from(rangeChecks)
    .innerJoin(flights, and(eq(flights.id, rangeChecks.flightId), eq(flights.organisationId, rangeChecks.organisationId)))
    .leftJoin(recordings, and(eq(recordings.id, rangeChecks.recordingId), eq(recordings.organisationId, rangeChecks.organisationId)));
}

export type RangeCheckListParams = ListParams & { flightId?: string };

export async function listRangeChecks(orgId: string, params: RangeCheckListParams) {
  // a flight of another organisation answers 404, like any of its records
  if (params.flightId) await getRangeCheckFlightOrThrow(orgId, params.flightId);
  const where = listWhere({
    orgFilter: eq(rangeChecks.organisationId, orgId),
    params,
    searchColumns: [rangeChecks.notes, rangeChecks.aircraft, rangeChecks.antennaOrientation, rangeChecks.cameraOrientation, rangeChecks.firmware],
    archivedColumn: rangeChecks.archivedAt,
    extra: [params.flightId ? eq(rangeChecks.flightId, params.flightId) : undefined],
  });
  const { ordering, keys } = keysetOf(
    params,
    {
      atSec: { expr: rangeChecks.atSec, type: "double precision" },
      event: { expr: rangeChecks.event, type: linkEventEnum, notNull: true },
      groundDistanceM: { expr: rangeChecks.groundDistanceM, type: "double precision", notNull: true },
      heightAglM: { expr: rangeChecks.heightAglM, type: "double precision", notNull: true },
      slantRangeM: { expr: rangeChecks.slantRangeM, type: "double precision", notNull: true },
      flownOn: { expr: flights.flownOn, type: "date", notNull: true },
      createdAt: { expr: rangeChecks.createdAt, type: "timestamptz", notNull: true },
    },
    // newest flight first, then along the flight
    [
      { expr: flights.flownOn, dir: "desc", type: "date", notNull: true },
      { expr: rangeChecks.atSec, dir: "asc", type: "double precision" },
      { expr: rangeChecks.createdAt, dir: "asc", type: "timestamptz", notNull: true },
      { expr: rangeChecks.id, dir: "asc", type: "uuid", notNull: true },
    ],
    rangeChecks.id,
  );
  const page = keysetPage(params);
  const [rows, counted] = await Promise.all([
    selectRangeChecks(keysetColumns(keys))
      .where(and(where, afterCursor(params.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    countUpTo(db().select({ one: sql`1` }).from(rangeChecks).where(where).$dynamic()),
  ]);
  return { ...pageOfRows(rows, params.pageSize, ordering, keys), ...counted };
}

export async function getRangeCheckOrThrow(orgId: string, id: string) {
  const [row] = await selectRangeChecks().where(and(eq(rangeChecks.id, id), eq(rangeChecks.organisationId, orgId)));
  if (!row) throw notFound("Range check not found");
  return row;
}

/** A refusal from the geodesy (no launch point, a bad number) becomes a 422 on the field that caused it. */
export function figuresOrFieldError(flight: RangeCheckFlight, values: Pick<RangeCheckValues, "position" | "heightAglM">): RangeCheckFigures {
  try {
    return computeRangeCheckFigures(flight.launch, values.position, values.heightAglM);
  } catch (err) {
    if (err instanceof GeoInputError) throw new ApiError("unprocessable", "Some fields are not valid", { [err.field]: [err.message] });
    throw err;
  }
}

function rowValues(values: Omit<RangeCheckValues, "position" | "heightAglM">, figures: RangeCheckFigures) {
  return {
    event: values.event,
    atSec: values.atSec,
    recordingId: values.recordingId,
    ...figures,
    antennaOrientation: values.antennaOrientation,
    cameraOrientation: values.cameraOrientation,
    aircraft: values.aircraft,
    firmware: values.firmware,
    notes: values.notes,
  };
}

export async function createRangeCheck(member: Member, input: RangeCheckCreateInput) {
  const orgId = member.organisationId;
  const flight = await getRangeCheckFlightOrThrow(orgId, input.flightId);
  if (input.recordingId) await requireRecordingOfFlight(orgId, flight.id, input.recordingId);
  const figures = figuresOrFieldError(flight, input);
  const [row] = await db()
    .insert(rangeChecks)
    .values({ organisationId: orgId, flightId: flight.id, createdBy: member.userId, ...rowValues(input, figures) })
    .returning({ id: rangeChecks.id });
  return getRangeCheckOrThrow(orgId, row.id);
}

/** A number in the unit the patch speaks, so stored metres merge with typed feet without a unit mix-up. */
const inUnits = (metres: number | null, units: DisplayUnits) => (metres === null ? null : fromMetres(metres, units));

/**
 * PATCH merges the given fields over the stored ones and checks the result as a whole: a change of
 * height alone recomputes the slant range from the stored distance, a change of position recomputes
 * the other half of the position from the flight's launch point.
 */
export async function updateRangeCheck(member: Member, id: string, patch: RangeCheckPatchInput) {
  const orgId = member.organisationId;
  const [stored] = await db().select().from(rangeChecks).where(and(eq(rangeChecks.id, id), eq(rangeChecks.organisationId, orgId), isNull(rangeChecks.archivedAt)));
  if (!stored) throw notFound("Range check not found");
  const units = patch.units ?? "m";
  // a patch that moves the position says how by the fields it sends, even without positionBy
  const sendsCoordinates = patch.latitude !== undefined || patch.longitude !== undefined;
  const sendsDistance = patch.groundDistance !== undefined || patch.bearingDeg !== undefined;
  if (!patch.positionBy && sendsCoordinates && sendsDistance) {
    throw new ApiError("unprocessable", "Some fields are not valid", { positionBy: ["Say whether the coordinates or the ground distance and bearing count"] });
  }
  const positionBy = patch.positionBy ?? (sendsCoordinates ? "coordinates" : "distance");
  const merged = {
    event: stored.event,
    atSec: stored.atSec,
    recordingId: stored.recordingId,
    // unless the patch moves the position, the stored distance and bearing reproduce the stored
    // coordinates (GeographicLib direct), so "distance" is the neutral way to re-derive them
    latitude: stored.latitude === null ? null : String(stored.latitude),
    longitude: stored.longitude === null ? null : String(stored.longitude),
    groundDistance: inUnits(stored.groundDistanceM, units),
    bearingDeg: stored.bearingDeg,
    heightAgl: inUnits(stored.heightAglM, units),
    antennaOrientation: stored.antennaOrientation,
    cameraOrientation: stored.cameraOrientation,
    aircraft: stored.aircraft,
    firmware: stored.firmware,
    notes: stored.notes,
    ...patch,
    positionBy,
    units,
  };
  const values = rangeCheckValuesInput.parse(merged);
  const flight = await getRangeCheckFlightOrThrow(orgId, stored.flightId);
  if (values.recordingId && values.recordingId !== stored.recordingId) await requireRecordingOfFlight(orgId, flight.id, values.recordingId);
  const figures = figuresOrFieldError(flight, values);
  await db()
    .update(rangeChecks)
    .set({ ...rowValues(values, figures), updatedAt: new Date() })
    .where(and(eq(rangeChecks.id, id), eq(rangeChecks.organisationId, orgId)));
  return getRangeCheckOrThrow(orgId, id);
}

/** DELETE archives: the row stays for the record but leaves lists, charts and exports. */
export async function archiveRangeCheck(orgId: string, id: string) {
  const [row] = await db()
    .update(rangeChecks)
    .set({ archivedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(rangeChecks.id, id), eq(rangeChecks.organisationId, orgId), isNull(rangeChecks.archivedAt)))
    .returning({ id: rangeChecks.id, archivedAt: rangeChecks.archivedAt });
  if (!row) throw notFound("Range check not found");
  return row;
}

export const activeRangeChecksOf = (orgId: string, flightId?: string): SQL =>
  and(eq(rangeChecks.organisationId, orgId), isNull(rangeChecks.archivedAt), flightId ? eq(rangeChecks.flightId, flightId) : undefined)!;
