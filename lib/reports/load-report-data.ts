// Gathers one job's report from the database: cover facts, the crew, flights and recordings with
// their original hashes, and every live finding with its moment, still and position. Read in one
// repeatable-read transaction, so the counts and the findings listed agree with each other.
import "server-only";
import { and, asc, desc, eq, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import type { Caution } from "@/lib/geo/cautions";
import { reportCautions } from "./report-cautions";
import { metresToFeet } from "@/lib/geo/units";
import { formatBytes } from "@/lib/uploads/format-bytes";
import { ASSET_KIND_LABELS, JOB_STATUS_MEANING } from "@/lib/validation/work";
import { loadFindingViews } from "@/lib/findings/finding-view";
import { frameRateFromFps, recordingTiming } from "@/lib/recordings/recording-frame-rate";
import { readRecordingFigures } from "@/lib/recordings/recording-figures";
import { describeRecordingDuration, describeRecordingSignal } from "./describe-recording-signal";
import { describeMoment } from "@/lib/findings/describe-moment";
import { SEVERITIES_WORST_FIRST, SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import { PRESERVATION_STATEMENT } from "./preservation-statement";
import type { ReportData, ReportFinding } from "./report-data";

const coords = (lat: number | null, lon: number | null) => (lat === null || lon === null ? null : `${lat.toFixed(6)}, ${lon.toFixed(6)}`);
const metresAndFeet = (m: number) => `${m.toFixed(1)} m (${metresToFeet(m).toFixed(0)} ft)`;

/** ISO date and 24-hour time in the site's time zone: "2026-03-14 09:41 (Europe/London)". */
function formatZoned(d: Date, timeZone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat("en-GB", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" })
      .formatToParts(d)
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute} (${timeZone})`;
}

export async function loadReportData(organisationId: string, reportId: string): Promise<ReportData> {
  return db().transaction(
    async (tx) => {
      const [head] = await tx
        .select({
          reportId: s.reports.id,
          version: s.reports.version,
          createdBy: s.reports.createdBy,
          jobId: s.jobs.id,
          jobTitle: s.jobs.title,
          scope: s.jobs.scope,
          status: s.jobs.status,
          dueDate: s.jobs.dueDate,
          pilotId: s.jobs.pilotId,
          reviewerId: s.jobs.reviewerId,
          siteName: s.sites.name,
          address: s.sites.address,
          siteLat: s.sites.latitude,
          siteLon: s.sites.longitude,
          timeZone: s.sites.timeZone,
          assetKind: s.sites.assetKind,
          clientName: s.clients.name,
          clientContact: s.clients.contactName,
          organisationName: s.organisations.name,
          defaultFps: s.organisations.defaultControllerFps,
        })
        .from(s.reports)
        .innerJoin(s.jobs, and(eq(s.jobs.id, s.reports.jobId), eq(s.jobs.organisationId, organisationId)))
        .innerJoin(s.sites, eq(s.sites.id, s.jobs.siteId))
        .innerJoin(s.clients, eq(s.clients.id, s.sites.clientId))
        .innerJoin(s.organisations, eq(s.organisations.id, s.reports.organisationId))
        .where(and(eq(s.reports.id, reportId), eq(s.reports.organisationId, organisationId)));
      if (!head) throw notFound("Report not found");
      const tz = head.timeZone || "UTC";

      const userIds = [head.pilotId, head.reviewerId, head.createdBy].filter((x): x is string => !!x);
      const people = userIds.length ? await tx.select({ id: s.users.id, name: s.users.name }).from(s.users).where(inArray(s.users.id, userIds)) : [];
      const nameOf = (id: string | null) => (id ? (people.find((p) => p.id === id)?.name ?? null) : null);

      const flights = await tx
        .select({
          id: s.flights.id,
          flownOn: s.flights.flownOn,
          pilot: s.users.name,
          aircraft: s.flights.aircraft,
          lat: s.flights.launchLatitude,
          lon: s.flights.launchLongitude,
          maxAltitudeAglM: s.flights.maxAltitudeAglM,
          notes: s.flights.notes,
        })
        .from(s.flights)
        .leftJoin(s.users, eq(s.users.id, s.flights.pilotId))
        .where(and(eq(s.flights.organisationId, organisationId), eq(s.flights.jobId, head.jobId), isNull(s.flights.archivedAt)))
        .orderBy(asc(s.flights.flownOn), asc(s.flights.createdAt));

      const recordings = await tx
        .select({
          id: s.recordings.id,
          flightId: s.recordings.flightId,
          name: s.recordings.originalName,
          sha256: s.recordings.sha256,
          sizeBytes: s.recordings.sizeBytes,
          durationSec: s.recordings.durationSec,
          facts: s.recordings.facts,
          figures: s.recordings.figures,
          fpsOverride: s.recordings.fpsOverride,
          state: s.recordings.state,
          createdAt: s.recordings.createdAt,
        })
        .from(s.recordings)
        .where(and(eq(s.recordings.organisationId, organisationId), eq(s.recordings.jobId, head.jobId), isNull(s.recordings.deletedAt)))
        .orderBy(asc(s.recordings.sequenceIndex), asc(s.recordings.createdAt));

      const views = await loadFindingViews(organisationId, eq(s.findings.jobId, head.jobId), tx);
      const recById = new Map(recordings.map((r) => [r.id, r]));
      const flightById = new Map(flights.map((f) => [f.id, f]));

      const findings: ReportFinding[] = views.map((f, i) => {
        const r = recById.get(f.recordingId);
        const timing = r ? recordingTiming({ fpsOverride: r.fpsOverride, durationSec: r.durationSec, facts: r.facts, figures: r.figures }, head.defaultFps) : null;
        const rate = timing?.rate ?? frameRateFromFps(head.defaultFps);
        const level = SEVERITY_SCALE[f.severity];
        const dist = [
          f.groundDistanceM !== null ? `ground ${metresAndFeet(f.groundDistanceM)}` : null,
          f.slantDistanceM !== null ? `slant ${metresAndFeet(f.slantDistanceM)}` : null,
        ].filter(Boolean);
        const still = f.still?.state === "ready" ? f.still : null;
        return {
          number: i + 1,
          id: f.id,
          severity: f.severity,
          severityLabel: level.label,
          severityMeaning: level.meaning,
          nbiRating: level.nbiRating,
          nbiWord: level.nbiWord,
          category: f.categoryName,
          note: f.note,
          recordingName: f.recordingName,
          recordingSha256: f.recordingSha256,
          start: describeMoment(f.startFrame, rate),
          end: f.endFrame === null ? null : describeMoment(f.endFrame, rate),
          position: coords(f.latitude, f.longitude),
          distances: dist.length ? `${dist.join(", ")} from the launch point` : null,
          box: f.box,
          still: still ? { storageKey: "", sha256: still.sha256, width: still.width, height: still.height } : null,
          stillMissing: still ? null : f.still?.state === "failed" ? "The still could not be extracted." : "The still was not ready when this report was built.",
          markedBy: f.createdBy?.name ?? null,
          version: f.version,
        };
      });
      // still file paths: looked up by id so the document reads them from the store
      const stillIds = views.map((v) => (v.still?.state === "ready" ? v.still.id : null)).filter((x): x is string => !!x);
      const stillRows = stillIds.length
        ? await tx.select({ id: s.stills.id, storageKey: s.stills.storageKey }).from(s.stills).where(and(eq(s.stills.organisationId, organisationId), inArray(s.stills.id, stillIds)))
        : [];
      views.forEach((v, i) => {
        const row = stillRows.find((r) => r.id === v.still?.id);
        if (findings[i].still && row?.storageKey) findings[i].still!.storageKey = row.storageKey;
        else if (findings[i].still) {
          findings[i].still = null;
          findings[i].stillMissing = "The still's file is missing from the store.";
        }
      });

      // from every height the report prints (flights' maxima and findings' heights), and the radio-range
      // caution when it prints a distance to the aircraft (lib/reports/report-cautions.ts)
      const cautions: Caution[] = reportCautions({
        heightsM: [...flights.map((f) => f.maxAltitudeAglM), ...views.map((v) => v.heightAglM)],
        showsDistances: views.some((v) => v.groundDistanceM !== null || v.slantDistanceM !== null),
      });

      // printed in the report, the chain's newest hash leaves Cairn with the client: an entry altered or
      // removed later would no longer lead to it
      const [custodyHead] = await tx
        .select({ seq: s.custodyEvents.seq, hash: s.custodyEvents.hash, occurredAt: s.custodyEvents.occurredAt })
        .from(s.custodyEvents)
        .where(eq(s.custodyEvents.organisationId, organisationId))
        .orderBy(desc(s.custodyEvents.seq))
        .limit(1);
      return {
        organisationName: head.organisationName,
        reportId: head.reportId,
        version: head.version,
        builtAt: formatZoned(new Date(), tz),
        timeZone: tz,
        builtBy: nameOf(head.createdBy),
        job: { title: head.jobTitle, scope: head.scope, status: JOB_STATUS_MEANING[head.status].label, dueDate: head.dueDate },
        client: { name: head.clientName, contact: head.clientContact },
        site: { name: head.siteName, address: head.address, coordinates: coords(head.siteLat, head.siteLon), assetKind: ASSET_KIND_LABELS[head.assetKind] },
        crew: [
          ...(nameOf(head.pilotId) ? [{ role: "Pilot in command", name: nameOf(head.pilotId)! }] : []),
          ...(nameOf(head.reviewerId) ? [{ role: "Reviewer", name: nameOf(head.reviewerId)! }] : []),
        ],
        flights: flights.map((f) => ({
          flownOn: f.flownOn,
          pilot: f.pilot,
          aircraft: f.aircraft,
          launch: coords(f.lat, f.lon),
          maxAltitude: f.maxAltitudeAglM === null ? null : `${metresAndFeet(f.maxAltitudeAglM)} AGL`,
          notes: f.notes,
          recordings: recordings.filter((r) => r.flightId === f.id).length,
        })),
        recordings: recordings.map((r) => ({
          name: r.name,
          sha256: r.sha256,
          size: `${formatBytes(r.sizeBytes)} (${r.sizeBytes.toLocaleString("en-GB")} bytes)`,
          duration: describeRecordingDuration(readRecordingFigures(r), r.durationSec),
          signal: describeRecordingSignal(readRecordingFigures(r)),
          flownOn: flightById.get(r.flightId)?.flownOn ?? "",
          uploadedAt: formatZoned(r.createdAt, tz),
        })),
        counts: SEVERITIES_WORST_FIRST.map((sev) => ({
          severity: sev,
          label: SEVERITY_SCALE[sev].label,
          nbiRating: SEVERITY_SCALE[sev].nbiRating,
          nbiWord: SEVERITY_SCALE[sev].nbiWord,
          count: findings.filter((f) => f.severity === sev).length,
        })),
        findings,
        cautions,
        preservation: PRESERVATION_STATEMENT,
        custodyHead: custodyHead ? { seq: custodyHead.seq, hash: custodyHead.hash, occurredAt: formatZoned(custodyHead.occurredAt, tz) } : null,
      };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
}
