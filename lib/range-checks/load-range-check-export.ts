// Every active range check of one flight (or of all flights) with the names around it: what the CSV
// export and the comparison chart read. Archived checks are left out of both.
import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, rangeChecks, recordings, signalTraces, sites } from "@/db/schema";
import type { RangeCheckExportRow } from "./build-range-checks-csv";
import type { ChartInputRow } from "./aggregate-range-chart";
import { getRangeCheckFlightOrThrow } from "./flight-for-range-check";
import { activeRangeChecksOf } from "./range-checks";
import { rangeCheckMeasureColumns } from "./range-check-measures";

export async function loadRangeCheckExportRows(orgId: string, flightId?: string): Promise<RangeCheckExportRow[]> {
  if (flightId) await getRangeCheckFlightOrThrow(orgId, flightId);
  return db()
    .select({
      id: rangeChecks.id,
      flownOn: flights.flownOn,
      jobTitle: jobs.title,
      siteName: sites.name,
      flightAircraft: flights.aircraft,
      recordingName: recordings.originalName,
      ...rangeCheckMeasureColumns,
      createdAt: rangeChecks.createdAt,
    })
    .from(rangeChecks)
    .innerJoin(flights, and(eq(flights.id, rangeChecks.flightId), eq(flights.organisationId, orgId)))
    .innerJoin(jobs, and(eq(jobs.id, flights.jobId), eq(jobs.organisationId, orgId)))
    .innerJoin(sites, and(eq(sites.id, jobs.siteId), eq(sites.organisationId, orgId)))
    .leftJoin(recordings, and(eq(recordings.id, rangeChecks.recordingId), eq(recordings.organisationId, orgId)))
    .where(activeRangeChecksOf(orgId, flightId))
    .orderBy(desc(flights.flownOn), asc(flights.id), asc(rangeChecks.atSec), asc(rangeChecks.createdAt));
}

/**
 * The chart compares setups, so a check without its own aircraft counts under the flight's. Each row
 * carries its flight, recording, second and frame (the second times the signal trace's frame rate,
 * rounded), so every point on the chart can be traced back to the moment it measured.
 */
export async function loadRangeChartRows(orgId: string, flightId?: string): Promise<ChartInputRow[]> {
  if (flightId) await getRangeCheckFlightOrThrow(orgId, flightId);
  const rows = await db()
    .select({
      id: rangeChecks.id,
      event: rangeChecks.event,
      slantRangeM: rangeChecks.slantRangeM,
      cameraOrientation: rangeChecks.cameraOrientation,
      antennaOrientation: rangeChecks.antennaOrientation,
      aircraft: sql<string | null>`coalesce(${rangeChecks.aircraft}, ${flights.aircraft})`,
      site: sites.name,
      flightId: flights.id,
      flownOn: flights.flownOn,
      recordingId: rangeChecks.recordingId,
      recordingName: recordings.originalName,
      atSec: rangeChecks.atSec,
      fps: signalTraces.fps,
    })
    .from(rangeChecks)
    .innerJoin(flights, and(eq(flights.id, rangeChecks.flightId), eq(flights.organisationId, orgId)))
    .innerJoin(jobs, and(eq(jobs.id, flights.jobId), eq(jobs.organisationId, orgId)))
    .innerJoin(sites, and(eq(sites.id, jobs.siteId), eq(sites.organisationId, orgId)))
    .leftJoin(recordings, and(eq(recordings.id, rangeChecks.recordingId), eq(recordings.organisationId, orgId)))
    .leftJoin(signalTraces, and(eq(signalTraces.recordingId, rangeChecks.recordingId), eq(signalTraces.organisationId, orgId)))
    .where(activeRangeChecksOf(orgId, flightId))
    .orderBy(asc(rangeChecks.createdAt));
  return rows.map(({ flightId: fid, flownOn, recordingId, recordingName, atSec, fps, ...r }) => ({
    ...r,
    source: { flightId: fid, flownOn, recordingId, recordingName, atSec, atFrame: atSec !== null && fps ? Math.round(atSec * fps) : null },
  }));
}
