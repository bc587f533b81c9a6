// The commit of a finished upload: exactly once, safe against a crash at every step, and the same
// bytes never stored twice in one organisation. The crash test kills a real upload server process
// with SIGKILL mid-upload; tus-js-client then resumes against the restarted one.
import { spawn, type ChildProcess } from "node:child_process";
import { createReadStream } from "node:fs";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { and, asc, eq } from "drizzle-orm";
import { Upload } from "@tus/server";
import * as tus from "tus-js-client";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, queue } from "@/lib/queue/jobs";
import { verifyChain } from "@/lib/custody/verify-chain";
import { placeOriginal } from "@/lib/storage/store";
import { storedBytes, storedExists, storedSha256 } from "@/tests/support/stored-files";
import { originalKey } from "@/lib/storage/storage-keys";
import { recordingIdForUpload } from "@/lib/uploads/recording-id-for-upload";
import { settleUpload } from "@/lib/uploads/settle-upload";
import { toTusMetadata } from "@/lib/uploads/upload-metadata";
import { uploadService } from "@/lib/uploads/upload-server";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeJob } from "@/tests/support/factories";
import { E2E_PORT } from "@/tests/support/test-env";
import { startUploadServer } from "@/tests/support/upload-server";
import { makePaddedRawH264, makeRawH264, sha256sum, sha256Hex } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, metadataFor, stagedDataSize, storeFiles, tusUpload, uploadIdOf, type Target } from "./upload-helpers";

const root = path.resolve(__dirname, "../../..");
let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let pilot: Record<string, string>;
let base: string;
let close: () => Promise<void>;

beforeAll(async () => {
  actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  pilot = await cookieOf(actors.pilot);
  ({ url: base, close } = await startUploadServer());
});
afterAll(async () => {
  await close();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

async function newTarget(jobId?: string): Promise<Target> {
  const f = await makeFlight(orgId, jobId ? { jobId } : {});
  return { jobId: f.jobId, flightId: f.id };
}

describe("the upload server killed with SIGKILL mid-upload", () => {
  let child: ChildProcess | undefined;
  const port = E2E_PORT + 7;

  async function startChild(): Promise<ChildProcess> {
    // node itself with tsx's loader: one process, so SIGKILL kills the server and not a wrapper
    const p = spawn(process.execPath, ["--import", "tsx", "tests/support/run-upload-server.ts"], {
      cwd: root,
      env: { ...process.env, UPLOAD_SERVER_PORT: String(port) },
      stdio: ["ignore", "pipe", "inherit"],
    });
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error("upload server did not start")), 60_000);
      p.stdout!.on("data", (d: Buffer) => {
        if (d.toString().includes("listening")) {
          clearTimeout(timer);
          resolve();
        }
      });
      p.once("exit", (code, signal) => reject(new Error(`upload server exited (${code ?? signal})`)));
    });
    return p;
  }
  afterEach(() => {
    child?.kill("SIGKILL");
  });

  it("resumes against the restarted server and completes byte-exact", async () => {
    const target = await newTarget();
    const size = 60 * 1000 * 1000;
    const file = await makePaddedRawH264(size, "sigkill");
    const reference = await sha256sum(file);
    child = await startChild();
    const killed = { at: -1, restarted: false, restartError: null as Error | null, firstPid: child.pid };
    const chunk = 1024 * 1024;
    const afterKill: number[] = [];
    const done = new Promise<{ url: string; outcome: string | null; progress: number[] }>((resolve, reject) => {
      const progress: number[] = [];
      {
        const upload = new tus.Upload(createReadStream(file) as unknown as Buffer, {
          endpoint: `http://127.0.0.1:${port}/api/uploads`,
          chunkSize: chunk,
          metadata: metadataFor(target, "REC_0042.264"),
          headers: pilot,
          // keep retrying while the server is down and restarting
          retryDelays: Array.from({ length: 60 }, () => 500),
          storeFingerprintForResuming: false,
          onProgress: (sent) => {
            progress.push(sent);
            if (killed.at >= 0) afterKill.push(sent);
            if (killed.at < 0 && sent >= size * 0.4) {
              killed.at = sent;
              child!.kill("SIGKILL");
              // restart after the client has seen the connection die
              setTimeout(() => {
                startChild().then(
                  (c) => {
                    child = c;
                    killed.restarted = true;
                  },
                  (err: Error) => (killed.restartError = err),
                );
              }, 1500);
            }
          },
          onSuccess: ({ lastResponse }) => resolve({ url: upload.url!, outcome: lastResponse.getHeader("Cairn-Upload-Outcome") ?? null, progress }),
          onError: reject,
        });
        upload.start();
      }
    });
    const result = await done;
    expect(killed.restartError).toBeNull();
    expect(killed.restarted).toBe(true);
    expect(child!.pid).not.toBe(killed.firstPid);
    expect(killed.at).toBeGreaterThan(0);
    // resumed from the offset the server had made durable, not from the start
    expect(Math.min(...afterKill)).toBeGreaterThanOrEqual(killed.at - 2 * chunk);
    expect(result.outcome).toBe("stored");
    const uploadId = uploadIdOf(result.url);
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadId));
    expect(row.sha256).toBe(reference);
    expect(await storedSha256(row.storageKey!)).toBe(reference);
    expect(row.sizeBytes).toBe(size);
  }, 180_000);
});

/** Stages a complete upload straight into the store, as if its last PATCH had just been written. */
async function stageComplete(data: Buffer, target: Target, filename: string): Promise<string> {
  const { store } = uploadService();
  const id = randomHexId();
  await store.create(new Upload({ id, size: data.length, offset: 0, metadata: toTusMetadata({ ...target, filename, organisationId: orgId, userId: actors.pilot!.userId }), creation_date: new Date().toISOString() }));
  await store.write(Readable.from([data]), id, 0);
  return id;
}
const randomHexId = () => [...crypto.getRandomValues(new Uint8Array(16))].map((b) => b.toString(16).padStart(2, "0")).join("");
const uploadRows = (uploadId: string) => db().select().from(recordings).where(eq(recordings.uploadId, uploadId));
const custodyFor = (recordingId: string) => db().select().from(custodyEvents).where(eq(custodyEvents.evidenceId, recordingId)).orderBy(custodyEvents.seq);

describe("a crash at each step of the commit", () => {
  it("a failed transaction leaves no row and no stored file; the bytes go back to staging and a retry commits them", async () => {
    const data = await readFile(await makeRawH264({ seconds: 1, pattern: "rgbtestsrc" }));
    const target = await newTarget();
    const id = await stageComplete(data, target, "crash-in-commit.264");
    const key = originalKey(orgId, recordingIdForUpload(id));
    const { store } = uploadService();

    await expect(settleUpload(store, id, { beforeCommit: () => Promise.reject(new Error("simulated crash")) })).rejects.toThrow("simulated crash");
    expect(await uploadRows(id)).toHaveLength(0);
    expect(await storedExists(key)).toBe(false);
    expect(sha256Hex(await readFile(store.dataPath(id)))).toBe(sha256Hex(data));

    const outcome = await settleUpload(store, id);
    expect(outcome).toMatchObject({ state: "stored", sha256: sha256Hex(data) });
    expect(await uploadRows(id)).toHaveLength(1);
    expect(sha256Hex(await storedBytes(key))).toBe(sha256Hex(data));
  });

  it("a crash after the file was placed but before its row: the retry finds it at its key and commits", async () => {
    const data = await readFile(await makeRawH264({ seconds: 1, pattern: "mandelbrot" }));
    const target = await newTarget();
    const id = await stageComplete(data, target, "crash-after-place.264");
    const { store } = uploadService();
    const key = originalKey(orgId, recordingIdForUpload(id));
    await placeOriginal(store.dataPath(id), key); // step 1 done, then the process "died"
    expect(await stagedDataSize(id)).toBeNull();

    const outcome = await settleUpload(store, id);
    expect(outcome).toMatchObject({ state: "stored", recordingId: recordingIdForUpload(id), sha256: sha256Hex(data) });
    const [row] = await uploadRows(id);
    expect(row.storageKey).toBe(key);
    expect(await custodyFor(row.id)).toHaveLength(1);
  });

  it("a crash after the commit: asking again reports the same recording, never a second row or event", async () => {
    const data = await readFile(await makeRawH264({ seconds: 1, pattern: "smptehdbars" }));
    const target = await newTarget();
    const id = await stageComplete(data, target, "crash-after-commit.264");
    const { store } = uploadService();
    const first = await settleUpload(store, id);
    // lose the tombstone and the queued job, as if the process died right after the transaction
    const info = (await store.readInfo(id))!;
    const { cairnDone: _d, cairnRecording: _r, ...metadata } = info.metadata!;
    await store.configstore.set(id, new Upload({ id, size: info.size, offset: 0, metadata, creation_date: info.creation_date }));
    await queue("process-recording").remove(`process-recording.${recordingIdForUpload(id)}`);

    const again = await settleUpload(store, id);
    expect(again).toEqual(first);
    expect(await uploadRows(id)).toHaveLength(1);
    expect(await custodyFor(recordingIdForUpload(id))).toHaveLength(1);
  });

  it("settling the same upload from three requests at once commits it once", async () => {
    const data = await readFile(await makeRawH264({ seconds: 1, pattern: "testsrc" }));
    const target = await newTarget();
    const id = await stageComplete(data, target, "race.264");
    const { store } = uploadService();
    const outcomes = await Promise.all([settleUpload(store, id), settleUpload(store, id), settleUpload(store, id)]);
    expect(outcomes.filter((o) => o.state === "stored").length).toBeGreaterThanOrEqual(1);
    expect(outcomes.every((o) => o.state === "stored" || o.state === "storing")).toBe(true);
    expect(await uploadRows(id)).toHaveLength(1);
    expect(await custodyFor(recordingIdForUpload(id))).toHaveLength(1);
  });
});

describe("the same bytes twice in one organisation", () => {
  it("in another flight: a recording linked to the existing original, no second copy, the pilot told", async () => {
    const file = await makeRawH264({ seconds: 1, pattern: "testsrc2", width: 320, height: 240 });
    const reference = await sha256sum(file);
    const a = await newTarget();
    const b = await newTarget((await makeJob(orgId)).id);
    const first = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(a, "REC_0100.264"), headers: pilot });
    expect(first.headers["Cairn-Upload-Outcome"]).toBe("stored");
    const holderId = first.headers["Cairn-Recording-Id"];
    const filesBefore = await storeFiles();

    const second = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(b, "copy of REC_0100.264"), headers: pilot });
    expect(second.headers["Cairn-Upload-Outcome"]).toBe("duplicate");
    expect(second.headers["Cairn-Duplicate-Of"]).toBe(holderId);
    expect(await storeFiles()).toEqual(filesBefore);

    const [holder] = await db().select().from(recordings).where(eq(recordings.id, holderId));
    const [linked] = await uploadRows(uploadIdOf(second.url));
    expect(linked).toMatchObject({ flightId: b.flightId, duplicateOfId: holderId, storageKey: holder.storageKey, sha256: reference, state: "waiting" });
    const events = await custodyFor(linked.id);
    expect(events.map((e) => e.eventType)).toEqual(["duplicate_upload"]);
    expect(events[0].details).toMatchObject({ duplicateOf: holderId, linked: true });
    expect(await queue("process-recording").getJob(`process-recording.${linked.id}`)).toBeTruthy();

    const outcome = await (await fetch(`${base}${new URL(second.url).pathname}`, { headers: pilot })).json();
    expect(outcome).toMatchObject({ state: "duplicate", linked: true, duplicateOf: { recordingId: holderId, originalName: "REC_0100.264", flightId: a.flightId } });
  });

  it("in the same flight: nothing new is filed, the attempt is in the custody log, the pilot is told", async () => {
    const file = await makeRawH264({ seconds: 1, pattern: "testsrc2", width: 352, height: 288 });
    const a = await newTarget();
    const first = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(a, "REC_0200.264"), headers: pilot });
    const holderId = first.headers["Cairn-Recording-Id"];
    const rowsBefore = await db().$count(recordings, eq(recordings.flightId, a.flightId));

    const again = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(a, "REC_0200.264", { relativePath: "/card2/REC_0200.264" }), headers: pilot });
    expect(again.headers["Cairn-Upload-Outcome"]).toBe("duplicate");
    expect(again.headers["Cairn-Recording-Id"]).toBe(holderId);
    expect(await db().$count(recordings, eq(recordings.flightId, a.flightId))).toBe(rowsBefore);
    expect(await stagedDataSize(uploadIdOf(again.url))).toBeNull();
    const events = await db()
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.evidenceId, holderId), eq(custodyEvents.eventType, "duplicate_upload")));
    expect(events).toHaveLength(1);
    expect(events[0].details).toMatchObject({ uploadId: uploadIdOf(again.url), linked: false });
    const outcome = await (await fetch(`${base}${new URL(again.url).pathname}`, { headers: pilot })).json();
    expect(outcome).toMatchObject({ state: "duplicate", linked: false, recordingId: holderId, duplicateOf: { recordingId: holderId } });
  });

  it("the organisation's custody chain still verifies after all of the above", async () => {
    const events = await db().select().from(custodyEvents).where(eq(custodyEvents.organisationId, orgId)).orderBy(asc(custodyEvents.seq));
    expect(events.length).toBeGreaterThan(0);
    expect(verifyChain(events)).toMatchObject({ ok: true, count: events.length });
  });
});
