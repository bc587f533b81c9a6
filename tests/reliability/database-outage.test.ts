// PostgreSQL crashes (pg_ctl -m immediate on the suite's own cluster) while uploads are running:
// meanwhile the app answers 503 with a message that says what is wrong (the tus endpoint and a JSON
// API route), it recovers on its own once PostgreSQL is back (same server process, no restart), the
// interrupted uploads complete, and every upload acknowledged before the crash is there, byte-exact.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFile, stat } from "node:fs/promises";
import * as tus from "tus-js-client";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { diskPath } from "@/tests/support/stored-files";
import * as jobsRoute from "@/app/api/jobs/route";
import { demoActors, req, type Actor } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makePaddedRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, metadataFor, uploadIdOf } from "@/tests/integration/ingest/upload-helpers";
import { startChaosProxy, type ChaosProxy } from "./support/chaos-proxy";
import { startUploadServerProcess, type ServerProcess } from "./support/upload-server-process";
import { RELIABILITY_PROXY_PORT, RELIABILITY_UPLOAD_PORT } from "./support/reliability-env";
import { postgresRunning, startPostgres, stopPostgresImmediate } from "./support/throwaway-services";

const trail: string[] = [];
const ACKED_FIRST = 3;
const DURING = 5;
const CHUNK_BYTES = 256 * 1024;
let server: ServerProcess;
let proxy: ChaosProxy;
let pilot: Record<string, string>;
let owner: Actor;
let orgId: string;

beforeAll(async () => {
  const actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  owner = actors.owner;
  pilot = await cookieOf(actors.pilot);
  server = await startUploadServerProcess(RELIABILITY_UPLOAD_PORT);
  // no cuts here: the proxy only slows the bytes down so the crash lands mid-upload
  proxy = await startChaosProxy({ listenPort: RELIABILITY_PROXY_PORT, targetPort: RELIABILITY_UPLOAD_PORT, cutRate: 0, minBytes: 0, maxBytes: 0, delayPerChunkMs: 15 });
});
afterAll(async () => {
  if (!postgresRunning()) startPostgres();
  await proxy?.close();
  server?.child.kill("SIGKILL");
  await closeQueues();
  await closeDb();
  await closeRedis();
});

async function upload(file: string, target: { jobId: string; id: string }, name: string, onBytes?: (n: number) => void): Promise<string> {
  // the whole file as the source, so tus-js-client can go back to any offset the server reports
  const source = await readFile(file);
  return new Promise((resolve, reject) => {
    const u = new tus.Upload(source, {
      endpoint: `http://127.0.0.1:${proxy.port}/api/uploads`,
      chunkSize: CHUNK_BYTES,
      metadata: metadataFor({ jobId: target.jobId, flightId: target.id }, name),
      headers: pilot,
      retryDelays: Array.from({ length: 300 }, () => 250),
      storeFingerprintForResuming: false,
      onProgress: (n) => onBytes?.(n),
      onShouldRetry: (err, attempt) => {
        trail.push(`${Date.now() % 100000} ${name} retry ${attempt}: ${String(err).slice(0, 200)}`);
        return true;
      },
      onSuccess: () => resolve(u.url!),
      onError: reject,
    });
    u.start();
  });
}

describe("PostgreSQL crashes during uploads", () => {
  it("503 with a clear message while it is down, recovery without a restart, nothing acknowledged is lost", async () => {
    const files: string[] = [];
    for (let i = 0; i < ACKED_FIRST + DURING; i++) files.push(await makePaddedRawH264(4 * 1024 * 1024 + i * 61 * 1024, `outage-${i}`));
    const digests = await Promise.all(files.map((f) => sha256sum(f)));
    const sizes = await Promise.all(files.map((f) => stat(f).then((s) => s.size)));
    const targets: { id: string; jobId: string }[] = [];
    for (let i = 0; i < files.length; i++) targets.push(await makeFlight(orgId));
    const ownerCookie = await req(owner, "GET", "/api/jobs"); // its session row is made while the database is up
    const pidBefore = server.child.pid;

    // acknowledged before the crash
    const acked = await Promise.all(files.slice(0, ACKED_FIRST).map((f, i) => upload(f, targets[i], `ACK_${i}.264`)));

    // running when it crashes
    const duringBytes = new Array<number>(DURING).fill(0);
    const duringTotal = sizes.slice(ACKED_FIRST).reduce((a, b) => a + b, 0);
    let crash!: () => void;
    const crashed = new Promise<void>((resolve) => (crash = resolve));
    const running = files.slice(ACKED_FIRST).map((f, j) =>
      upload(f, targets[ACKED_FIRST + j], `RUN_${j}.264`, (n) => {
        duringBytes[j] = n;
        if (duringBytes.reduce((a, b) => a + b, 0) >= duringTotal * 0.3) crash();
      }),
    );
    await crashed;
    stopPostgresImmediate();
    const crashedAtPercent = Math.round((duringBytes.reduce((a, b) => a + b, 0) / duringTotal) * 100);

    // while it is down: the tus endpoint and a JSON route say what is wrong, with 503 and Retry-After
    const head = await fetch(`http://127.0.0.1:${RELIABILITY_UPLOAD_PORT}/api/uploads/${uploadIdOf(acked[0])}`, {
      method: "HEAD",
      headers: { ...pilot, "Tus-Resumable": "1.0.0" },
    });
    expect(head.status).toBe(503);
    expect(head.headers.get("retry-after")).toMatch(/^\d+$/);
    const outcome = await fetch(`http://127.0.0.1:${RELIABILITY_UPLOAD_PORT}/api/uploads/${uploadIdOf(acked[0])}`, { headers: pilot });
    expect(outcome.status).toBe(503);
    const outcomeBody = await outcome.json();
    expect(outcomeBody.error.code).toBe("unavailable");
    expect(outcomeBody.error.message).toMatch(/database/i);
    const api = await jobsRoute.GET(ownerCookie);
    expect(api.status).toBe(503);
    expect((await api.json()).error).toMatchObject({ code: "unavailable", message: expect.stringMatching(/database/i) });
    await new Promise((r) => setTimeout(r, 2000)); // the running uploads keep retrying against it

    startPostgres();
    const completed = await Promise.race([
      Promise.all(running),
      new Promise<never>((_, reject) =>
        setTimeout(() => reject(new Error(`uploads did not finish after recovery: bytes ${duringBytes.join(", ")} of ${sizes.slice(ACKED_FIRST).join(", ")}\ntrail:\n${trail.slice(-30).join("\n")}\nnow ${Date.now() % 100000}`)), 90_000).unref(),
      ),
    ]);
    // the same server process: it recovered without a restart
    expect(server.child.exitCode).toBeNull();
    expect(server.child.pid).toBe(pidBefore);
    expect((await jobsRoute.GET(await req(owner, "GET", "/api/jobs"))).status).toBe(200);

    const urls = [...acked, ...completed];
    let byteExact = 0;
    for (let i = 0; i < urls.length; i++) {
      const uploadId = uploadIdOf(urls[i]);
      const res = await fetch(`http://127.0.0.1:${RELIABILITY_UPLOAD_PORT}/api/uploads/${uploadId}`, { headers: pilot });
      expect(res.status).toBe(200);
      expect((await res.json()).state).toBe("stored");
      const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadId));
      expect(row, `upload ${i} has its recording row`).toBeDefined();
      expect(row.sha256).toBe(digests[i]);
      expect(row.sizeBytes).toBe(sizes[i]);
      expect(await sha256sum(diskPath(row.storageKey!))).toBe(digests[i]);
      byteExact++;
    }
    console.log(
      `[reliability] database outage: ${ACKED_FIRST} uploads acknowledged before the crash, ${DURING} running (crash at ${crashedAtPercent}% of their bytes); ` +
        `after recovery ${urls.length} stored, ${byteExact} byte-exact; server pid unchanged`,
    );
    expect(byteExact).toBe(ACKED_FIRST + DURING);
  });
});
