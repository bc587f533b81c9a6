// Benchmark (not a test): a 1 GiB upload over loopback through Cairn's tus endpoint, against a
// baseline of a plain streaming HTTP PUT to a bare Node http server that writes the body to the
// same disk and fsyncs it, run side by side in one run. Prints both throughputs, their ratio, and
// the peak resident memory (VmHWM) of the web process that served the tus upload.
// With STORAGE_BACKEND=s3 the web process stores originals in the S3 store (the local S3 server must be
// up: CAIRN_NEED_S3=1 npm run services:up), and the baseline is a plain multipart upload of the same
// file to the same bucket with @aws-sdk/lib-storage (8 MiB parts, 4 at once), timed until it completes.
// Targets: ratio >= 0.7, peak RSS < 300 MB. Each tus round uploads new bytes (64 random bytes are
// rewritten first), so no round is taken for a duplicate; the bench removes its recordings after.
//
// Run (uses a test slot's database, seeded by any integration test run of that slot):
//   CAIRN_TEST_SLOT=2 npx tsx bench/upload-throughput.ts
// Options (environment):
//   BENCH_MB=1024        size of the upload in MiB (default 1024)
//   BENCH_ROUNDS=3       rounds of every side, in an order that turns each round (default 3; medians
//                        printed, with the range of the per-round ratios)
//   BENCH_CHUNKS_MB=16,32  further PATCH sizes to compare with the uploader's (MiB, comma-separated)
//   BENCH_TARGET=next|node  the web process: `next start` on the slot's build (the default when
//                        that build exists: `npm test` leaves one), or the stand-alone server around
//                        the same route module (tests/support/upload-server.ts; the default otherwise)
//
// What each side does per upload:
//   baseline  one PUT, body streamed to a file, fsync, 201.
//   tus       tus-js-client: POST, then PATCHes (each authorised, written, hashed as it arrives,
//             synced in the background as it arrives and fsynced before its offset is
//             acknowledged), then the commit: content check, rename into the store, one transaction
//             (recording row + custody event), enqueue. Timed until tus-js-client reports success,
//             so the commit is included. Two variants: the whole file in one PATCH (like-for-like
//             with the single PUT), and the browser uploader's UPLOAD_CHUNK_BYTES PATCHes; more
//             with BENCH_CHUNKS_MB.
//   context   the bare server again, fed the uploader's pieces (each written in place and fsynced):
//             what cutting the transfer into acknowledged pieces costs without any tus code.
// The shared disk of a small virtual machine varies a lot from one minute to the next: rounds turn
// the order of the sides, and each ratio is printed with the range of its per-round ratios.
import { spawn, type ChildProcess } from "node:child_process";
import { createReadStream, createWriteStream, existsSync } from "node:fs";
import { mkdir, open, readFile, rm } from "node:fs/promises";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { randomBytes } from "node:crypto";

const root = path.resolve(__dirname, "..");

// ---------------------------------------------------------------------------------------------
// Child mode: the baseline server. `tsx bench/upload-throughput.ts --baseline-server <port> <dir>`
// ---------------------------------------------------------------------------------------------
if (process.argv[2] === "--baseline-server") {
  const port = Number(process.argv[3]);
  const dir = process.argv[4];
  let n = 0;
  const server = http.createServer(async (req, res) => {
    if (req.method !== "PUT") return void res.writeHead(405).end();
    // one PUT for the whole file, or (with X-Offset) one piece of it written in place, like a PATCH
    const piece = req.headers["x-offset"] !== undefined;
    const file = path.join(dir, piece ? `pieces-${String(req.headers["x-upload"]).replace(/[^a-z0-9-]/gi, "")}` : `put-${process.pid}-${n++}`);
    const offset = Number(req.headers["x-offset"] ?? 0);
    try {
      await pipeline(req, createWriteStream(file, { flags: offset === 0 ? "w" : "r+", start: offset }));
      // fsync through a second descriptor: Linux flushes the file's dirty pages whichever fd asks
      const fh = await open(file, "r");
      await fh.sync();
      await fh.close();
      res.writeHead(201).end();
      if (!piece || req.headers["x-last"] === "1") await rm(file, { force: true });
    } catch (err) {
      res.writeHead(500).end(String(err));
      await rm(file, { force: true });
    }
  });
  server.listen(port, "127.0.0.1", () => process.stdout.write("listening\n"));
} else {
  void main().catch((err) => {
    console.error(err);
    process.exit(1);
  });
}

async function main() {
  const { TEST_ENV, E2E_PORT } = await import("@/tests/support/test-env");
  if (process.env.CAIRN_TEST_SLOT) Object.assign(process.env, TEST_ENV);
  const { env } = await import("@/lib/config/env");
  const { db, closeDb } = await import("@/db/client");
  const { recordings } = await import("@/db/schema");
  const { eq } = await import("drizzle-orm");
  const { removeKey } = await import("@/lib/storage/store");
  const { closeQueues } = await import("@/lib/queue/jobs");
  const { closeRedis } = await import("@/lib/queue/redis");
  const { UPLOAD_CHUNK_BYTES } = await import("@/lib/uploads/upload-limits");
  const { actorByEmail, sessionCookie } = await import("@/tests/support/session");
  const { makeFlight } = await import("@/tests/support/factories");
  const { paddedH264 } = await import("./support/padded-h264");
  const tus = await import("tus-js-client");

  const mib = Number(process.env.BENCH_MB ?? 1024);
  const rounds = Number(process.env.BENCH_ROUNDS ?? 3);
  const size = mib * 1024 * 1024;
  const distDir = process.env.NEXT_DIST_DIR ?? TEST_ENV.NEXT_DIST_DIR;
  const built = existsSync(path.join(root, distDir, "BUILD_ID"));
  const target = (process.env.BENCH_TARGET ?? (built ? "next" : "node")) as "node" | "next";
  if (target === "next" && !built) throw new Error(`BENCH_TARGET=next needs a build in ${distDir}`);
  if (!process.env.BENCH_TARGET && !built) console.log(`no build in ${distDir}: measuring the stand-alone server around the route module instead of next start`);
  const webPort = E2E_PORT + 8;
  const basePort = E2E_PORT + 9;

  // the source: a real raw H.264 head (the content check reads it) padded with random bytes
  const source = await paddedH264(path.join(os.tmpdir(), "cairn-bench", `upload-${mib}MiB.264`), size);
  // each tus round must carry new bytes, or it would be recognised as a duplicate and not stored
  const freshen = async () => {
    const fh = await open(source, "r+");
    await fh.write(randomBytes(64), 0, 64, 1024 * 1024);
    await fh.close();
  };

  const baselineDir = path.join(path.dirname(env().uploadDir), "bench-baseline");
  await mkdir(baselineDir, { recursive: true });
  await mkdir(env().uploadDir, { recursive: true });

  const childEnv = { ...process.env, PORT: String(webPort), UPLOAD_SERVER_PORT: String(webPort), NEXT_DIST_DIR: distDir };
  const web =
    target === "next"
      ? spawn(path.join(root, "node_modules/.bin/next"), ["start", "-p", String(webPort), "-H", "127.0.0.1"], { cwd: root, env: childEnv, stdio: ["ignore", "pipe", "inherit"] })
      : spawn(process.execPath, ["--import", "tsx", "tests/support/run-upload-server.ts"], { cwd: root, env: childEnv, stdio: ["ignore", "pipe", "inherit"] });
  const baseline = spawn(process.execPath, ["--import", "tsx", "bench/upload-throughput.ts", "--baseline-server", String(basePort), baselineDir], { cwd: root, env: process.env, stdio: ["ignore", "pipe", "inherit"] });
  const children: ChildProcess[] = [web, baseline];
  const stopAll = () => children.forEach((c) => c.kill("SIGTERM"));
  process.on("exit", stopAll);
  await waitListening(baseline, `http://127.0.0.1:${basePort}/`);
  await waitListening(web, `http://127.0.0.1:${webPort}/api/uploads`, target === "next");

  const pilot = await actorByEmail("pilot@kestrelmoor.example");
  const flight = await makeFlight(pilot.organisationId, { aircraft: "bench" });
  const cookie = await sessionCookie(pilot);

  // STORAGE_BACKEND=s3: the baseline is the SDK's own multipart upload of the file to the same bucket
  const onS3 = env().STORAGE_BACKEND === "s3";
  const s3Once = async () => {
    const { objectStore } = await import("@/lib/storage/store");
    const { S3Store } = await import("@/lib/storage/s3-store");
    const { Upload } = await import("@aws-sdk/lib-storage");
    const { DeleteObjectCommand } = await import("@aws-sdk/client-s3");
    const store = objectStore();
    if (!(store instanceof S3Store)) throw new Error("STORAGE_BACKEND=s3 expected");
    await store.ensureBucket();
    const Key = `bench-baseline/${process.pid}-${Date.now()}`;
    const t0 = process.hrtime.bigint();
    await new Upload({ client: store.client, params: { Bucket: store.opts.bucket, Key, Body: createReadStream(source), ContentLength: size }, partSize: 8 * 1024 * 1024, queueSize: 4 }).done();
    const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
    await store.client.send(new DeleteObjectCommand({ Bucket: store.opts.bucket, Key }));
    return seconds;
  };

  const putOnce = () =>
    new Promise<number>((resolve, reject) => {
      const t0 = process.hrtime.bigint();
      const req = http.request({ host: "127.0.0.1", port: basePort, method: "PUT", path: "/", headers: { "Content-Length": String(size) } }, (res) => {
        res.resume();
        res.on("end", () => (res.statusCode === 201 ? resolve(Number(process.hrtime.bigint() - t0) / 1e9) : reject(new Error(`baseline answered ${res.statusCode}`))));
      });
      req.on("error", reject);
      createReadStream(source).pipe(req);
    });

  /** The bare server again, but the file sent in pieces of `chunk` bytes, each written in place and fsynced. */
  const putPieces = async (chunk: number) => {
    const t0 = process.hrtime.bigint();
    const agent = new http.Agent({ keepAlive: true });
    const id = `u${Date.now()}`;
    for (let off = 0; off < size; off += chunk) {
      const len = Math.min(chunk, size - off);
      await new Promise<void>((resolve, reject) => {
        const headers = { "Content-Length": String(len), "X-Offset": String(off), "X-Upload": id, "X-Last": off + len >= size ? "1" : "0" };
        const req = http.request({ host: "127.0.0.1", port: basePort, method: "PUT", path: "/", agent, headers }, (res) => {
          res.resume();
          res.on("end", () => (res.statusCode === 201 ? resolve() : reject(new Error(`baseline answered ${res.statusCode}`))));
        });
        req.on("error", reject);
        createReadStream(source, { start: off, end: off + len - 1 }).pipe(req);
      });
    }
    agent.destroy();
    return Number(process.hrtime.bigint() - t0) / 1e9;
  };

  const createdRecordings: string[] = [];
  const tusOnce = (chunkSize: number) =>
    new Promise<number>((resolve, reject) => {
      const t0 = process.hrtime.bigint();
      const upload = new tus.Upload(createReadStream(source) as unknown as Buffer, {
        endpoint: `http://127.0.0.1:${webPort}/api/uploads`,
        chunkSize,
        retryDelays: [],
        headers: { cookie },
        storeFingerprintForResuming: false,
        metadata: { jobId: flight.jobId, flightId: flight.id, filename: `bench-${Date.now()}.264`, filetype: "", relativePath: "null" },
        onSuccess: ({ lastResponse }) => {
          const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
          const outcome = lastResponse.getHeader("Cairn-Upload-Outcome");
          const id = lastResponse.getHeader("Cairn-Recording-Id");
          if (id) createdRecordings.push(id);
          if (outcome !== "stored") reject(new Error(`tus upload ended with outcome ${outcome}`));
          else resolve(seconds);
        },
        onError: reject,
      });
      upload.start();
    });

  // One PATCH for the whole file is the like-for-like of the single PUT; UPLOAD_CHUNK_BYTES PATCHes
  // are what the browser uploader sends. BENCH_CHUNKS_MB adds other piece sizes for comparison.
  const mb = (bytes: number) => `${bytes / 1024 / 1024} MiB`;
  const extraChunks = (process.env.BENCH_CHUNKS_MB ?? "")
    .split(",")
    .filter(Boolean)
    .map((m) => Number(m) * 1024 * 1024)
    .filter((c) => c !== UPLOAD_CHUNK_BYTES);
  type Side = { label: string; kind: "baseline" | "pieces" | "tus"; chunk: number; uploader?: boolean; run: () => Promise<number>; times: number[] };
  const sides: Side[] = [
    onS3
      ? { label: "baseline, SDK multipart upload to the S3", kind: "baseline", chunk: Infinity, run: s3Once, times: [] }
      : { label: "baseline, plain streaming PUT + fsync", kind: "baseline", chunk: Infinity, run: putOnce, times: [] },
    { label: `(context) bare server, ${mb(UPLOAD_CHUNK_BYTES)} PUTs + fsync`, kind: "pieces", chunk: UPLOAD_CHUNK_BYTES, run: () => putPieces(UPLOAD_CHUNK_BYTES), times: [] },
    { label: "tus, one PATCH (like-for-like)", kind: "tus", chunk: Infinity, run: () => freshen().then(() => tusOnce(Infinity)), times: [] },
    ...[UPLOAD_CHUNK_BYTES, ...extraChunks].map(
      (chunk): Side => ({
        label: `tus, ${mb(chunk)} PATCHes${chunk === UPLOAD_CHUNK_BYTES ? " (uploader)" : ""}`,
        kind: "tus",
        chunk,
        uploader: chunk === UPLOAD_CHUNK_BYTES,
        run: () => freshen().then(() => tusOnce(chunk)),
        times: [],
      }),
    ),
  ];
  const median = (xs: number[]) => {
    const s = [...xs].sort((a, b) => a - b);
    return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
  };
  try {
    for (let r = 0; r < rounds; r++) {
      // the order turns each round, so a slow spell of the shared disk does not always hit the same side
      const order = sides.map((_, i) => sides[(i + r) % sides.length]);
      for (const side of order) side.times.push(await side.run());
      console.log(`round ${r + 1}: ${sides.map((s) => `${s.label} ${(mib / s.times[r]).toFixed(0)} MiB/s`).join(", ")}`);
    }
    const base = sides[0];
    const pieces = sides[1];
    const rate = (s: Side) => mib / median(s.times);
    // per-round ratios against the same round's baseline show the spread the medians hide
    const spread = (s: Side) => {
      const ratios = s.times.map((t, i) => base.times[i] / t);
      return `${Math.min(...ratios).toFixed(2)}-${Math.max(...ratios).toFixed(2)}`;
    };
    const webPeak = await peakRssMiB(web.pid!);
    const basePeak = await peakRssMiB(baseline.pid!);
    console.log("");
    console.log(`upload of ${mib} MiB over loopback, ${rounds} rounds (median times), web process: ${target === "next" ? `next start (${distDir})` : "stand-alone server around the route module"}, store: ${env().STORAGE_BACKEND}; load average ${os.loadavg().map((l) => l.toFixed(1)).join(" ")} on ${os.cpus().length} CPUs`);
    console.log(`  ${"".padEnd(40)} ${"MiB/s".padStart(5)}  ${"median".padStart(8)}  ratio (per-round range)`);
    for (const s of sides) {
      const ratio = rate(s) / rate(base);
      const head = `  ${s.label.padEnd(40)} ${rate(s).toFixed(0).padStart(5)}  ${`${median(s.times).toFixed(2)} s`.padStart(8)}`;
      if (s === base) console.log(head);
      else if (s === pieces) console.log(`${head}  ${ratio.toFixed(2)} (${spread(s)}): what pieces of this size cost without tus`);
      else {
        const goal = s.chunk === Infinity || s.uploader ? ` target >= 0.70: ${ratio >= 0.7 ? "met" : "NOT met"}` : "";
        const vsPieces = s.chunk === UPLOAD_CHUNK_BYTES ? `; ${(rate(s) / rate(pieces)).toFixed(2)} of the bare server in the same pieces` : "";
        console.log(`${head}  ${ratio.toFixed(2)} (${spread(s)})${goal}${vsPieces}`);
      }
    }
    console.log(`  peak RSS (VmHWM) of the web process: ${webPeak.toFixed(0)} MiB = ${(webPeak * 1.048576).toFixed(0)} MB (target < 300 MB: ${webPeak * 1.048576 < 300 ? "met" : "NOT met"}); baseline server: ${basePeak.toFixed(0)} MiB`);
  } finally {
    // the bench's own recordings and originals, so repeated runs do not fill the disk
    for (const id of createdRecordings) {
      const [row] = await db().select({ key: recordings.storageKey }).from(recordings).where(eq(recordings.id, id));
      if (row?.key) await removeKey(row.key);
      await db().delete(recordings).where(eq(recordings.id, id));
    }
    stopAll();
    await closeQueues();
    await closeRedis();
    await closeDb();
  }
}

async function waitListening(child: ChildProcess, url: string, poll = false) {
  if (!poll) {
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`${url} did not start`)), 90_000);
      child.stdout!.on("data", (d: Buffer) => d.toString().includes("listening") && (clearTimeout(timer), resolve()));
      child.once("exit", (code) => reject(new Error(`server for ${url} exited with ${code}`)));
    });
    return;
  }
  child.stdout!.resume();
  const end = Date.now() + 90_000;
  while (Date.now() < end) {
    try {
      await fetch(url, { method: "OPTIONS" });
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 300));
    }
  }
  throw new Error(`${url} did not start`);
}

/** Largest VmHWM (peak resident set, kB in /proc) among a process and its descendants, in MiB. */
async function peakRssMiB(pid: number): Promise<number> {
  let peak = 0;
  const visit = async (p: number) => {
    const status = await readFile(`/proc/${p}/status`, "utf8").catch(() => "");
    const kb = Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? 0);
    peak = Math.max(peak, kb / 1024);
    const children = await readFile(`/proc/${p}/task/${p}/children`, "utf8").catch(() => "");
    for (const c of children.trim().split(/\s+/).filter(Boolean)) await visit(Number(c));
  };
  await visit(pid);
  return peak;
}
