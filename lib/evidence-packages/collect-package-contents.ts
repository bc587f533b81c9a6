// What an evidence package holds, read from the database for one selection (a whole job, one flight of
// it, or chosen recordings of it), with every refusal a request can meet decided here, before anything
// is queued or written: another organisation's or an unknown job, flight or recording (not found), a
// job whose files were disposed of, chosen recordings that are deleted or being deleted, and a
// selection with nothing in it. A job under legal hold may be packaged: packaging removes nothing.
import "server-only";
import { and, asc, eq, inArray, isNull, or, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, custodyEvents, findings, flights, jobs, organisations, recordings, renditions, reports, sites, stills } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { statKey } from "@/lib/storage/store";
import { cleanFileName, recordingFolder } from "./package-layout";

export type PackageSelection = { jobId: string; flightId?: string | null; recordingIds?: string[] | null };

export type PackageFile = {
  /** below data/ */
  path: string;
  storageKey: string;
  sizeBytes: number;
  /** the SHA-256 Cairn recorded for this file (null where none was kept) */
  sha256: string | null;
  kind: "original" | "rendition" | "still" | "report";
  evidenceId: string;
  recordingId: string | null;
  store: boolean;
};

export type PackageContents = {
  organisation: { id: string; name: string };
  job: { id: string; title: string; status: string; legalHold: boolean; siteName: string; clientName: string };
  flight: { id: string; flownOn: string } | null;
  selection: "job" | "flight" | "recordings";
  recordings: { id: string; originalName: string; sha256: string; sizeBytes: number; state: string }[];
  files: PackageFile[];
  /** the ids whose custody events go in (recordings, renditions, stills, findings, reports) */
  evidenceIds: string[];
};

const RECORDING_STATES_WITHOUT_RENDITIONS = new Set(["waiting", "processing", "failed"]);
export const hasNoRenditionsYet = (state: string) => RECORDING_STATES_WITHOUT_RENDITIONS.has(state);

export async function collectPackageContents(organisationId: string, selection: PackageSelection): Promise<PackageContents> {
  const [job] = await db()
    .select({ id: jobs.id, title: jobs.title, status: jobs.status, legalHold: jobs.legalHold, disposedAt: jobs.disposedAt, siteName: sites.name, clientName: clients.name, organisationName: organisations.name })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .innerJoin(organisations, eq(organisations.id, jobs.organisationId))
    .where(and(eq(jobs.id, selection.jobId), eq(jobs.organisationId, organisationId)));
  if (!job) throw notFound("Job not found");
  if (job.disposedAt) throw new ApiError("gone", `The files of "${job.title}" were disposed of on ${job.disposedAt.toISOString().slice(0, 10)}; only its custody trail is left.`);

  let flight: PackageContents["flight"] = null;
  if (selection.flightId) {
    const [f] = await db()
      .select({ id: flights.id, flownOn: flights.flownOn })
      .from(flights)
      .where(and(eq(flights.id, selection.flightId), eq(flights.organisationId, organisationId), eq(flights.jobId, job.id)));
    if (!f) throw notFound("Flight not found in this job");
    flight = f;
  }

  const chosen = selection.recordingIds?.length ? [...new Set(selection.recordingIds.map((id) => id.toLowerCase()))] : null;
  const recRows = await db()
    .select({
      id: recordings.id,
      originalName: recordings.originalName,
      sha256: recordings.sha256,
      sizeBytes: recordings.sizeBytes,
      storageKey: recordings.storageKey,
      state: recordings.state,
      deletedAt: recordings.deletedAt,
    })
    .from(recordings)
    .where(
      and(
        eq(recordings.organisationId, organisationId),
        eq(recordings.jobId, job.id),
        flight ? eq(recordings.flightId, flight.id) : undefined,
        chosen ? inArray(recordings.id, chosen) : isNull(recordings.deletedAt),
      ),
    )
    .orderBy(asc(recordings.flightId), asc(recordings.sequenceIndex), asc(recordings.createdAt));
  if (chosen) {
    const found = new Set(recRows.map((r) => r.id));
    const missing = chosen.filter((id) => !found.has(id));
    if (missing.length) throw notFound(`${missing.length} of the chosen recordings are not in this job${flight ? "'s flight" : ""}`);
    const deleted = recRows.filter((r) => r.deletedAt);
    if (deleted.length) {
      throw new ApiError("conflict", `Deleted recordings cannot be packaged: ${deleted.map((r) => r.originalName).join(", ")}. Their custody trail is kept; choose other recordings.`);
    }
  }
  const noOriginal = recRows.filter((r) => !r.storageKey);
  if (noOriginal.length) throw new ApiError("conflict", `No stored original for ${noOriginal.map((r) => r.originalName).join(", ")}: these recordings cannot be packaged yet.`);

  const recIds = recRows.map((r) => r.id);
  const files: PackageFile[] = [];
  const evidenceIds: string[] = [...recIds];
  const rendRows = recIds.length
    ? await db()
        .select({ id: renditions.id, recordingId: renditions.recordingId, storageKey: renditions.storageKey, sizeBytes: renditions.sizeBytes, sha256: renditions.sha256, kind: renditions.kind })
        .from(renditions)
        .where(and(eq(renditions.organisationId, organisationId), inArray(renditions.recordingId, recIds)))
        .orderBy(asc(renditions.kind))
    : [];
  const stillRows = recIds.length
    ? await db()
        .select({ id: stills.id, recordingId: stills.recordingId, storageKey: stills.storageKey, sha256: stills.sha256, frameNumber: stills.frameNumber })
        .from(stills)
        .where(and(eq(stills.organisationId, organisationId), inArray(stills.recordingId, recIds), eq(stills.state, "ready")))
        .orderBy(asc(stills.frameNumber), asc(stills.id))
    : [];
  const findingRows = recIds.length
    ? await db().select({ id: findings.id }).from(findings).where(and(eq(findings.organisationId, organisationId), inArray(findings.recordingId, recIds)))
    : [];
  evidenceIds.push(...findingRows.map((f) => f.id));

  for (const [i, r] of recRows.entries()) {
    const folder = recordingFolder(i, r.id);
    files.push({ path: `${folder}/original/${cleanFileName(r.originalName)}`, storageKey: r.storageKey!, sizeBytes: r.sizeBytes, sha256: r.sha256, kind: "original", evidenceId: r.id, recordingId: r.id, store: true });
    for (const d of rendRows.filter((x) => x.recordingId === r.id)) {
      files.push({ path: `${folder}/renditions/${cleanFileName(d.storageKey)}`, storageKey: d.storageKey, sizeBytes: d.sizeBytes, sha256: d.sha256, kind: "rendition", evidenceId: d.id, recordingId: r.id, store: d.kind !== "thumbnails_vtt" });
      evidenceIds.push(d.id);
    }
    for (const s of stillRows.filter((x) => x.recordingId === r.id && x.storageKey)) {
      const size = (await statKey(s.storageKey!))?.size ?? 0;
      files.push({ path: `${folder}/stills/frame-${s.frameNumber}-${s.id}.jpg`, storageKey: s.storageKey!, sizeBytes: size, sha256: s.sha256, kind: "still", evidenceId: s.id, recordingId: r.id, store: true });
      evidenceIds.push(s.id);
    }
  }

  const reportRows = await db()
    .select({ id: reports.id, version: reports.version, storageKey: reports.storageKey, sizeBytes: reports.sizeBytes, sha256: reports.sha256 })
    .from(reports)
    .where(and(eq(reports.organisationId, organisationId), eq(reports.jobId, job.id), eq(reports.state, "approved")))
    .orderBy(asc(reports.version));
  for (const rep of reportRows) {
    evidenceIds.push(rep.id);
    if (!rep.storageKey) continue;
    files.push({ path: `reports/report-v${rep.version}-${rep.id}.pdf`, storageKey: rep.storageKey, sizeBytes: rep.sizeBytes ?? 0, sha256: rep.sha256, kind: "report", evidenceId: rep.id, recordingId: null, store: false });
  }

  if (files.length === 0) {
    const what = chosen ? "the chosen recordings" : flight ? "this flight" : "this job";
    throw new ApiError("unprocessable", `Nothing to package: ${what} has no recordings and no approved report yet.`);
  }

  return {
    organisation: { id: organisationId, name: job.organisationName },
    job: { id: job.id, title: job.title, status: job.status, legalHold: job.legalHold, siteName: job.siteName, clientName: job.clientName },
    flight,
    selection: chosen ? "recordings" : flight ? "flight" : "job",
    recordings: recRows.map(({ id, originalName, sha256, sizeBytes, state }) => ({ id, originalName, sha256, sizeBytes, state })),
    files,
    evidenceIds,
  };
}

/**
 * The custody events of everything in the package: events about its recordings, renditions, stills,
 * findings and reports (and those naming a recording in their details); for a whole-job package also
 * every event filed under the job (holds, shares, earlier packages).
 */
export function packageTrailCondition(organisationId: string, contents: Pick<PackageContents, "job" | "selection" | "evidenceIds" | "recordings">): SQL {
  const recIds = contents.recordings.map((r) => r.id);
  return and(
    eq(custodyEvents.organisationId, organisationId),
    or(
      contents.evidenceIds.length ? inArray(custodyEvents.evidenceId, contents.evidenceIds) : undefined,
      recIds.length ? inArray(sql`${custodyEvents.details}->>'recordingId'`, recIds) : undefined,
      contents.selection === "job" ? or(eq(custodyEvents.jobId, contents.job.id), eq(custodyEvents.evidenceId, contents.job.id)) : undefined,
      // events about the job itself (legal holds) belong to every package of it
      and(eq(custodyEvents.evidenceType, "job"), eq(custodyEvents.evidenceId, contents.job.id)),
    ),
  )!;
}

/** Bytes the package will take, for the free-disk check: the files, plus room for the text it writes. */
export function estimatePackageBytes(contents: PackageContents, custodyEventCount: number): number {
  const files = contents.files.reduce((n, f) => n + f.sizeBytes, 0);
  // per entry ~200 bytes of ZIP headers and a manifest line; per custody event ~3 kB in JSON and CSV
  return files + (contents.files.length + 16) * 400 + custodyEventCount * 3000 + 64 * 1024;
}
