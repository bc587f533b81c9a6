// Uploads on several web instances: two upload servers as processes of their own (the very route module
// Next serves at /api/uploads, tests/support/run-upload-server.ts) share one staging folder and one
// database, as two web instances behind a load balancer without affinity would.
// 1. A resumable upload started through instance A, which then dies (SIGKILL), is finished through
//    instance B, byte-exact (SHA-256 by GNU coreutils' sha256sum, which shares no code with ours).
// 2. Two instances asked to write the same upload at once: the shared lock keeps the second waiting
//    while the first writes, then refuses it (409 or 410: the upload moved on); the original is the first
//    body whole. With a lock per process (@tus/server's MemoryLocker) the second writes over the first.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFile } from "node:fs/promises";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storedSha256 } from "@/tests/support/stored-files";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makePaddedRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { startUploadServerProcess, type ServerProcess } from "@/tests/reliability/support/upload-server-process";
import { cookieOf, encodeMetadata, metadataFor, tusRequest, tusUpload, uploadIdOf, type Target } from "./upload-helpers";

const slot = Number(process.env.CAIRN_TEST_SLOT ?? 0);
const PORT_A = 41_001 + slot * 10;
const PORT_B = 41_002 + slot * 10;
const baseA = `http://127.0.0.1:${PORT_A}`;
const baseB = `http://127.0.0.1:${PORT_B}`;

let actors: Record<DemoActorKey, Actor>;
let target: Target;
let pilot: Record<string, string>;
let a: ServerProcess;
let b: ServerProcess;
// every server started, killed at the end even when a start beside it failed
const started: ServerProcess[] = [];
const start = async (port: number) => {
  const p = await startUploadServerProcess(port);
  started.push(p);
  return p;
};

beforeAll(async () => {
  actors = await demoActors();
  const flight = await makeFlight(actors.pilot!.organisationId);
  target = { jobId: flight.jobId, flightId: flight.id };
  pilot = await cookieOf(actors.pilot);
  const [sa, sb] = await Promise.allSettled([start(PORT_A), start(PORT_B)]);
  if (sa.status === "rejected") throw sa.reason;
  if (sb.status === "rejected") throw sb.reason;
  [a, b] = [sa.value, sb.value];
});
afterAll(async () => {
  for (const p of started) p.child.kill("SIGKILL");
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("an upload across two web instances", () => {
  it("started through one instance, which then dies, is finished through the other, byte-exact", async () => {
    const size = 60 * 1000 * 1000;
    const file = await makePaddedRawH264(size, "across-instances");
    const reference = await sha256sum(file);
    const chunk = 4 * 1024 * 1024;
    const first = await tusUpload({ endpoint: `${baseA}/api/uploads`, source: file, metadata: metadataFor(target, "REC_0101.264"), headers: pilot, chunkSize: chunk, abortAfterBytes: size / 2 });
    const location = new URL(first.url).pathname;
    a.child.kill("SIGKILL");
    await new Promise((r) => a.child.once("exit", r));

    const head = await tusRequest(baseB, "HEAD", location, { headers: pilot });
    expect(head.status).toBe(200);
    const offset = Number(head.headers.get("upload-offset"));
    expect(offset).toBeGreaterThan(0);
    expect(offset).toBeLessThan(size);

    const second = await tusUpload({ endpoint: `${baseB}/api/uploads`, source: file, metadata: metadataFor(target, "REC_0101.264"), headers: pilot, chunkSize: chunk, uploadUrl: `${baseB}${location}` });
    expect(Math.min(...second.progress)).toBeGreaterThanOrEqual(offset); // resumed, not restarted
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadIdOf(location)));
    expect(row).toMatchObject({ sha256: reference, sizeBytes: size, originalName: "REC_0101.264" });
    expect(await storedSha256(row.storageKey!)).toBe(reference);
    const events = await db().select().from(custodyEvents).where(and(eq(custodyEvents.evidenceId, row.id), eq(custodyEvents.eventType, "upload")));
    expect(events).toHaveLength(1);
    a = await start(PORT_A); // for the next test
  }, 300_000);

  it("written through both instances at once: the first writer keeps the lock, the second is refused, the original is the first body whole", async () => {
    const size = 24 * 1000 * 1000;
    const bodies = [await readFile(await makePaddedRawH264(size, "race-a")), await readFile(await makePaddedRawH264(size, "race-b"))];
    const sha = bodies.map((x) => createHash("sha256").update(x).digest("hex"));
    expect(sha[0]).not.toBe(sha[1]);
    const created = await tusRequest(baseA, "POST", "/api/uploads", {
      headers: { ...pilot, "Upload-Length": String(size), "Upload-Metadata": encodeMetadata(metadataFor(target, "REC_0102.264")) },
    });
    expect(created.status).toBe(201);
    const location = created.headers.get("location")!;
    const headers = { ...pilot, "Tus-Resumable": "1.0.0", "Upload-Offset": "0", "Content-Type": "application/offset+octet-stream" };
    // A's body arrives slowly: 1 MB, a pause of 2 s, then the rest. B's whole body is sent during the pause.
    let resume!: () => void;
    const paused = new Promise<void>((r) => (resume = r));
    const slow = new ReadableStream<Uint8Array>({
      async start(controller) {
        controller.enqueue(bodies[0].subarray(0, 1_000_000));
        await paused;
        controller.enqueue(bodies[0].subarray(1_000_000));
        controller.close();
      },
    });
    const fromA = fetch(`${baseA}${location}`, { method: "PATCH", headers, body: slow, duplex: "half" } as RequestInit);
    await new Promise((r) => setTimeout(r, 500)); // A holds the upload's lock and is writing
    const fromB = fetch(`${baseB}${location}`, { method: "PATCH", headers, body: bodies[1] });
    setTimeout(resume, 2000);
    const [ra, rb] = await Promise.all([fromA, fromB]);
    // A, which held the lock, stores its body; B waited for the lock, then found the upload moved on:
    // 409 (offset mismatch) or 410 (its data already left the staging folder for the store)
    expect(ra.status, await ra.clone().text()).toBe(204);
    expect([409, 410]).toContain(rb.status);
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadIdOf(location)));
    expect(row.sha256).toBe(sha[0]);
    expect(await storedSha256(row.storageKey!)).toBe(sha[0]);
  }, 300_000);
});
