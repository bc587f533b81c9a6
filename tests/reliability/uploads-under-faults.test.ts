// 20 resumable uploads at once (tus-js-client, an independent tus implementation) through a TCP proxy
// of ours that cuts connections at random points, and one SIGKILL of the upload server process in the
// middle (restarted a moment later): every upload completes, and every stored original is byte-exact,
// checked with GNU sha256sum against the source file.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createReadStream } from "node:fs";
import * as tus from "tus-js-client";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { diskPath } from "@/tests/support/stored-files";
import { demoActors } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makePaddedRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, metadataFor, uploadIdOf } from "@/tests/integration/ingest/upload-helpers";
import { startChaosProxy, type ChaosProxy } from "./support/chaos-proxy";
import { startUploadServerProcess, type ServerProcess } from "./support/upload-server-process";
import { RELIABILITY_PROXY_PORT, RELIABILITY_UPLOAD_PORT } from "./support/reliability-env";

const UPLOADS = 20;
const CHUNK_BYTES = 512 * 1024;
let server: ServerProcess;
let proxy: ChaosProxy;
let pilot: Record<string, string>;
let orgId: string;

beforeAll(async () => {
  const actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  pilot = await cookieOf(actors.pilot);
  server = await startUploadServerProcess(RELIABILITY_UPLOAD_PORT);
  proxy = await startChaosProxy({ listenPort: RELIABILITY_PROXY_PORT, targetPort: RELIABILITY_UPLOAD_PORT, cutRate: 0.6, minBytes: 1024, maxBytes: (3 * CHUNK_BYTES) / 2 });
});
afterAll(async () => {
  await proxy?.close();
  server?.child.kill("SIGKILL");
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("uploads through cut connections and a killed server", () => {
  it("all 20 complete, byte-exact", async () => {
    const t0 = Date.now();
    // one after another: the fixture cache writes each file once
    const sources: string[] = [];
    for (let i = 0; i < UPLOADS; i++) sources.push(await makePaddedRawH264(3 * 1024 * 1024 + i * 97 * 1024, `reliability-${i}`));
    const digests = await Promise.all(sources.map((f) => sha256sum(f)));
    const targets: { id: string; jobId: string }[] = [];
    for (let i = 0; i < UPLOADS; i++) targets.push(await makeFlight(orgId));
    const sizes = await Promise.all(sources.map(async (f) => (await import("node:fs/promises")).stat(f).then((s) => s.size)));
    const total = sizes.reduce((a, b) => a + b, 0);
    const sent = new Array<number>(UPLOADS).fill(0);
    const kill = { done: false, atPercent: 0, restarted: false, pidBefore: server.child.pid, error: null as Error | null };

    const runs = sources.map(
      (file, i) =>
        new Promise<string>((resolve, reject) => {
          const upload = new tus.Upload(createReadStream(file) as unknown as Buffer, {
            endpoint: `http://127.0.0.1:${proxy.port}/api/uploads`,
            chunkSize: CHUNK_BYTES,
            metadata: metadataFor({ jobId: targets[i].jobId, flightId: targets[i].id }, `REC_${String(i).padStart(4, "0")}.264`),
            headers: pilot,
            // keep retrying through cuts and the restart
            retryDelays: Array.from({ length: 300 }, () => 200),
            storeFingerprintForResuming: false,
            onProgress: (bytes) => {
              sent[i] = bytes;
              if (!kill.done && sent.reduce((a, b) => a + b, 0) >= total * 0.4) {
                kill.done = true;
                kill.atPercent = Math.round((sent.reduce((a, b) => a + b, 0) / total) * 100);
                server.child.kill("SIGKILL");
                setTimeout(() => {
                  startUploadServerProcess(RELIABILITY_UPLOAD_PORT).then(
                    (s) => {
                      server = s;
                      kill.restarted = true;
                    },
                    (err: Error) => (kill.error = err),
                  );
                }, 1000);
              }
            },
            onSuccess: () => resolve(upload.url!),
            onError: reject,
          });
          upload.start();
        }),
    );
    const urls = await Promise.all(runs);
    expect(kill.error).toBeNull();
    expect(kill.done && kill.restarted).toBe(true);
    expect(server.child.pid).not.toBe(kill.pidBefore);

    let byteExact = 0;
    for (let i = 0; i < UPLOADS; i++) {
      const uploadId = uploadIdOf(urls[i]);
      // the outcome, asked directly (not through the proxy); asking also finishes an interrupted commit
      const res = await fetch(`http://127.0.0.1:${RELIABILITY_UPLOAD_PORT}/api/uploads/${uploadId}`, { headers: pilot });
      expect(res.status).toBe(200);
      expect((await res.json()).state).toBe("stored");
      const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadId));
      expect(row.sizeBytes).toBe(sizes[i]);
      expect(row.sha256).toBe(digests[i]);
      // GNU sha256sum over the stored file: a hasher that shares no code with ours
      expect(await sha256sum(diskPath(row.storageKey!))).toBe(digests[i]);
      byteExact++;
    }
    console.log(
      `[reliability] uploads: ${UPLOADS} started, ${urls.length} completed, ${byteExact} byte-exact; ` +
        `connections ${proxy.stats.connections}, cut ${proxy.stats.cut}, refused while the server was down ${proxy.stats.refused}; ` +
        `server killed once (SIGKILL) at ${kill.atPercent}% of all bytes sent; ${((Date.now() - t0) / 1000).toFixed(1)} s`,
    );
    expect(byteExact).toBe(UPLOADS);
    expect(proxy.stats.cut).toBeGreaterThanOrEqual(10);
  });
});
