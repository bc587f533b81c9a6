// The commit of a processing job's results on its own, without the worker or the queue: what one call
// writes (rows, the derived folder, custody events), that a second call writes nothing, and that a
// recording deleted meanwhile gets neither rows nor files. The stored bytes are checked against
// SHA-256 computed here with node:crypto, and the outputs come from a real derivation of an x264 stream.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { mkdir, mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { eq, inArray, or } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, renditions, signalTraces } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { withLocalCopy } from "@/lib/storage/store";
import { storedBytes, storedKeysUnder } from "@/tests/support/stored-files";
import { derivedFolderKey } from "@/lib/storage/storage-keys";
import { commitRecordingOutputs } from "@/lib/processing/commit-recording-outputs";
import { deriveRecordingOutputs, type DeriveResult } from "@/lib/processing/derive-recording-outputs";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { demoOrganisationId } from "@/tests/support/session";
import { makeRecordingWithOriginal } from "@/tests/support/factories";

let orgId: string;
let dir: string;
let source: string;

beforeAll(async () => {
  orgId = await demoOrganisationId();
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-commit-"));
  source = await makeRawH264({ seconds: 1 });
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await closeDb();
  await closeRedis();
});

/** A waiting recording and the outputs of a real derivation of its original, in a work folder. */
async function derived(): Promise<{ rec: Awaited<ReturnType<typeof makeRecordingWithOriginal>>; result: DeriveResult; workDir: string }> {
  const rec = await makeRecordingWithOriginal(orgId, source);
  const workDir = path.join(dir, rec.id);
  await mkdir(workDir, { recursive: true });
  const result = await withLocalCopy(rec.storageKey!, (originalPath) =>
    deriveRecordingOutputs({ declaredKind: "raw_h264", originalPath, fpsOverride: null, organisationDefaultFps: 30, workDir, signal: new AbortController().signal }),
  );
  return { rec, result, workDir };
}

/** The custody events about this recording and its renditions (other recordings share its original's hash). */
async function eventsFor(recordingId: string) {
  const ids = (await db().select({ id: renditions.id }).from(renditions).where(eq(renditions.recordingId, recordingId))).map((r) => r.id);
  return db().select().from(custodyEvents).where(or(eq(custodyEvents.evidenceId, recordingId), ids.length ? inArray(custodyEvents.evidenceId, ids) : undefined));
}

describe("commitRecordingOutputs", () => {
  it("writes the renditions, the trace, the facts and the custody events in one go, and the files where the rows say", async () => {
    const { rec, result, workDir } = await derived();
    expect(result.outputs.length).toBeGreaterThan(0);
    expect(await commitRecordingOutputs(rec, result, workDir, { queueJobId: "q-1", attempt: 2 })).toBe(true);

    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row).toMatchObject({ state: "ready", progress: 100, failureReason: null, durationSec: result.durationSec });
    expect(row.facts).toEqual(result.facts);
    const rows = await db().select().from(renditions).where(eq(renditions.recordingId, rec.id));
    expect(rows.map((r) => r.kind).sort()).toEqual(result.outputs.map((o) => o.kind).sort());
    for (const r of rows) {
      expect(r.storageKey.startsWith(`${derivedFolderKey(orgId, rec.id)}/`)).toBe(true);
      const bytes = await storedBytes(r.storageKey);
      expect(createHash("sha256").update(bytes).digest("hex"), r.kind).toBe(r.sha256);
    }
    expect(await db().$count(signalTraces, eq(signalTraces.recordingId, rec.id))).toBe(result.trace ? 1 : 0);

    const events = await eventsFor(rec.id);
    const processing = events.filter((e) => e.eventType === "processing" && e.evidenceId === rec.id);
    expect(processing).toHaveLength(1);
    expect(processing[0].details).toMatchObject({ queueJobId: "q-1", attempt: 2, outputs: rows.length });
    const derivedEvents = events.filter((e) => e.eventType === "derived");
    // one per rendition, plus the signal trace when there is one
    expect(derivedEvents).toHaveLength(rows.length + (result.trace ? 1 : 0));
    for (const r of rows) expect(derivedEvents.find((e) => e.evidenceId === r.id)).toMatchObject({ outputSha256: r.sha256, storageLocation: r.storageKey });
  });

  it("a second commit of the same recording writes nothing (a job run twice commits once)", async () => {
    const { rec, result, workDir } = await derived();
    expect(await commitRecordingOutputs(rec, result, workDir, { queueJobId: "q-2", attempt: 1 })).toBe(true);
    const before = (await eventsFor(rec.id)).length;
    expect(await commitRecordingOutputs(rec, result, workDir, { queueJobId: "q-2", attempt: 2 })).toBe(false);
    expect((await eventsFor(rec.id)).length).toBe(before);
    expect(await db().$count(renditions, eq(renditions.recordingId, rec.id))).toBe(result.outputs.length);
  });

  it("a recording deleted meanwhile gets no rows, no files and no events", async () => {
    const { rec, result, workDir } = await derived();
    await db().update(recordings).set({ deletedAt: new Date() }).where(eq(recordings.id, rec.id));
    expect(await commitRecordingOutputs(rec, result, workDir, { queueJobId: "q-3", attempt: 1 })).toBe(false);
    expect(await db().$count(renditions, eq(renditions.recordingId, rec.id))).toBe(0);
    expect(await storedKeysUnder(derivedFolderKey(orgId, rec.id))).toEqual([]);
    expect(await eventsFor(rec.id)).toEqual([]);
  });
});
