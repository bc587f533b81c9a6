// Recordings of a flight or a job (or the whole organisation), for the recordings table: name,
// size, kind, duration when known, processing state and progress, hash and tags; filtered, sorted
// and paged on the server by keyset (lib/api/keyset.ts).
import "server-only";
import { and, eq, exists, ilike, isNull, or, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import { db } from "@/db/client";
import { flights, jobs, processingStateEnum, recordingKindEnum, recordingTags, recordings, tags, users } from "@/db/schema";
import { listQuery } from "@/lib/api/with-org";
import { safeText } from "@/lib/validation/common";
import { keysetOf, keysetPage, type SortKey } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, type KeyPart, countUpTo } from "@/lib/api/keyset";

export const RECORDING_STATES = ["waiting", "processing", "ready", "failed"] as const;
export const RECORDING_KINDS = ["raw_h264", "mp4", "mov", "jpeg"] as const;

export const recordingListQuery = listQuery.extend({
  flightId: z.string().uuid("Not a flight id").optional(),
  jobId: z.string().uuid("Not a job id").optional(),
  state: z.enum(RECORDING_STATES).optional(),
  kind: z.enum(RECORDING_KINDS).optional(),
  tag: safeText().min(1).max(40).optional(),
  sort: z.enum(["sequence", "name", "size", "kind", "duration", "state", "recordedAt", "uploadedAt"]).optional(),
});
export type RecordingListQuery = z.infer<typeof recordingListQuery>;

const tagNames = sql<string[]>`coalesce((
  select array_agg(${tags.name} order by lower(${tags.name}))
  from ${recordingTags} join ${tags} on ${tags.id} = ${recordingTags.tagId}
  where ${recordingTags.recordingId} = ${recordings.id}
), '{}')`;

export const recordingColumns = {
  id: recordings.id,
  originalName: recordings.originalName,
  relativePath: recordings.relativePath,
  sizeBytes: recordings.sizeBytes,
  kind: recordings.kind,
  sha256: recordings.sha256,
  durationSec: recordings.durationSec,
  state: recordings.state,
  progress: recordings.progress,
  failureReason: recordings.failureReason,
  duplicateOfId: recordings.duplicateOfId,
  flightId: recordings.flightId,
  flownOn: flights.flownOn,
  jobId: recordings.jobId,
  jobTitle: jobs.title,
  sequenceIndex: recordings.sequenceIndex,
  recorderModifiedAt: recordings.recorderModifiedAt,
  createdAt: recordings.createdAt,
  uploadedByName: users.name,
  tags: tagNames,
};

const SORTABLE: Record<NonNullable<RecordingListQuery["sort"]>, SortKey> = {
  sequence: { expr: recordings.sequenceIndex, type: "int", notNull: true },
  name: { expr: sql`lower(${recordings.originalName})`, type: "text", notNull: true },
  size: { expr: recordings.sizeBytes, type: "bigint", notNull: true },
  kind: { expr: recordings.kind, type: recordingKindEnum, notNull: true },
  duration: { expr: recordings.durationSec, type: "double precision" },
  state: { expr: recordings.state, type: processingStateEnum, notNull: true },
  recordedAt: { expr: recordings.recorderModifiedAt, type: "timestamptz" },
  uploadedAt: { expr: recordings.createdAt, type: "timestamptz", notNull: true },
};

// the flight's order, then the upload time, then the id: a total order, served by
// recordings_org_seq_idx / recordings_org_flight_idx / recordings_org_job_idx
const DEFAULT_KEYS: KeyPart[] = [
  { expr: recordings.sequenceIndex, dir: "asc", type: "int", notNull: true },
  { expr: recordings.createdAt, dir: "asc", type: "timestamptz", notNull: true },
  { expr: recordings.id, dir: "asc", type: "uuid", notNull: true },
];

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listRecordings(organisationId: string, q: RecordingListQuery, scope?: SQL) {
  const where: (SQL | undefined)[] = [eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt), scope];
  if (q.flightId) where.push(eq(recordings.flightId, q.flightId));
  if (q.jobId) where.push(eq(recordings.jobId, q.jobId));
  if (q.state) where.push(eq(recordings.state, q.state));
  if (q.kind) where.push(eq(recordings.kind, q.kind));
  if (q.tag) {
    where.push(
      exists(
        db()
          .select({ one: sql`1` })
          .from(recordingTags)
          .innerJoin(tags, eq(tags.id, recordingTags.tagId))
          .where(and(eq(recordingTags.recordingId, recordings.id), sql`lower(${tags.name}) = lower(${q.tag})`)),
      ),
    );
  }
  const text = q.q?.trim();
  if (text) {
    // LIKE wildcards in the search mean themselves
    const pattern = `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(recordings.originalName, pattern), ilike(recordings.relativePath, pattern), eq(recordings.sha256, text.toLowerCase())));
  }
  // the sequence order is the default; asked for explicitly it is the same keys
  const { ordering, keys } = q.sort === "sequence" && q.dir === "asc" ? { ordering: "default", keys: DEFAULT_KEYS } : keysetOf(q, SORTABLE, DEFAULT_KEYS, recordings.id);
  const page = keysetPage(q);
  const [rows, counted] = await Promise.all([
    db()
      .select({ ...recordingColumns, ...keysetColumns(keys) })
      .from(recordings)
      .innerJoin(flights, eq(flights.id, recordings.flightId))
      .innerJoin(jobs, eq(jobs.id, recordings.jobId))
      .leftJoin(users, eq(users.id, recordings.uploadedBy))
      .where(and(...where, afterCursor(q.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    // counted apart from the page: the page's columns (tags, names) are computed for its rows only
    countUpTo(db().select({ one: sql`1` }).from(recordings).where(and(...where)).$dynamic()),
  ]);
  return { ...pageOfRows(rows, q.pageSize, ordering, keys), ...counted };
}
