// Benchmark: packaging a job of 50 recordings (about 2 GB) as an evidence package, against a plain
// `zip` (Info-ZIP) of the same files, side by side in one run, with the peak memory of the processes
// that build and serve the package.
// Run: CAIRN_TEST_SLOT=<n> npx tsx bench/evidence-package.ts [recordings=50] [MiB per recording=40]
// Needs Info-ZIP `zip` (Debian package zip). Uses the test slot's database (tests/support/test-env.ts)
// with a scratch organisation, and a store of its own under .data/bench/evidence-package (the
// originals are random bytes, like compressed video: kept between runs, made again when missing).
//
// Printed side by side, over the same originals (page cache warm for all, each read once first):
//   zip -0        Info-ZIP storing the files (the archive work with nothing compressed)
//   zip -6        Info-ZIP's default deflate (what "zip -r" does)
//   package       the worker's build (lib/evidence-packages/write-evidence-package.ts) in a child
//                 process: originals checked against their SHA-256, manifests, custody files, then the
//                 written ZIP read back and hashed; its peak RSS
//   download      the web app's download handler (lib/evidence-packages/serve-evidence-package.ts)
//                 serving the ZIP whole to a sink, in a child process; its peak RSS
import { execFileSync, spawnSync } from "node:child_process";
import { createHash, randomFillSync } from "node:crypto";
import { createWriteStream, existsSync, statSync } from "node:fs";
import { mkdir, rm } from "node:fs/promises";
import path from "node:path";
import { TEST_ENV } from "@/tests/support/test-env";

const BENCH_DIR = path.resolve(".data/bench/evidence-package");
Object.assign(process.env, TEST_ENV, { STORAGE_DIR: path.join(BENCH_DIR, "storage"), EVIDENCE_PACKAGE_DISK_RESERVE_BYTES: "0", TSA_URL: "off" });

const MiB = 1024 * 1024;
const mb = (bytes: number, seconds: number) => `${(bytes / 1e6 / seconds).toFixed(0)} MB/s`;

type ChildReport = { seconds: number; maxRssMiB: number; startRssMiB: number; bytes: number; sha256?: string };

/** Runs this file as a child in a role ("build" or "serve"), returning what it printed as JSON. */
function child(role: "build" | "serve", arg: string): ChildReport {
  const res = spawnSync(process.execPath, [...process.execArgv, __filename, `--${role}`, arg], { env: process.env, encoding: "utf8", maxBuffer: 16 * MiB });
  if (res.status !== 0) throw new Error(`${role} child failed: ${res.stderr || res.stdout}`);
  const line = res.stdout.trim().split("\n").pop()!;
  return JSON.parse(line) as ChildReport;
}

async function writeRandomFile(file: string, bytes: number): Promise<string> {
  const hash = createHash("sha256");
  const out = createWriteStream(file);
  const chunk = Buffer.alloc(4 * MiB);
  for (let left = bytes; left > 0; left -= chunk.length) {
    const piece = left >= chunk.length ? chunk : chunk.subarray(0, left);
    randomFillSync(piece);
    hash.update(piece);
    if (!out.write(piece)) await new Promise<void>((r) => out.once("drain", () => r()));
  }
  await new Promise<void>((resolve, reject) => out.end((err?: Error | null) => (err ? reject(err) : resolve())));
  return hash.digest("hex");
}

function sha256File(file: string): string {
  return execFileSync("sha256sum", [file]).toString().split(" ")[0];
}

function timed(cmd: string, args: string[], cwd: string): number {
  const t = process.hrtime.bigint();
  const r = spawnSync(cmd, args, { cwd, stdio: "ignore" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} exited ${r.status}`);
  return Number(process.hrtime.bigint() - t) / 1e9;
}

async function buildChild(packageId: string) {
  const { db, closeDb } = await import("@/db/client");
  const { evidencePackages } = await import("@/db/schema");
  const { eq } = await import("drizzle-orm");
  const { buildEvidencePackage } = await import("@/worker/handlers/build-evidence-package");
  const startRssMiB = process.memoryUsage().rss / MiB;
  const t = process.hrtime.bigint();
  const outcome = await buildEvidencePackage({ packageId });
  const seconds = Number(process.hrtime.bigint() - t) / 1e9;
  if (outcome !== "built") throw new Error(`package ${outcome}`);
  const [row] = await db().select({ sizeBytes: evidencePackages.sizeBytes, sha256: evidencePackages.sha256 }).from(evidencePackages).where(eq(evidencePackages.id, packageId));
  await closeDb();
  const { closeRedis } = await import("@/lib/queue/redis");
  await closeRedis().catch(() => {});
  console.log(JSON.stringify({ seconds, maxRssMiB: process.resourceUsage().maxRSS / 1024, startRssMiB, bytes: row.sizeBytes, sha256: row.sha256 }));
}

async function serveChild(arg: string) {
  const [organisationId, packageId, userId] = arg.split(":");
  const { closeDb } = await import("@/db/client");
  const { loadServablePackage, servePackageDownload } = await import("@/lib/evidence-packages/serve-evidence-package");
  const file = await loadServablePackage(organisationId, packageId);
  const startRssMiB = process.memoryUsage().rss / MiB;
  const t = process.hrtime.bigint();
  // the download route's body: the whole package (200), read to the end as a client would
  const res = await servePackageDownload(new Request("http://localhost/bench"), file, { userId, role: "owner" }, { clientAddress: null, userAgent: "bench" });
  if (res.status !== 200) throw new Error(`GET answered ${res.status}`);
  const reader = res.body!.getReader();
  const hash = createHash("sha256");
  let bytes = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    bytes += value.length;
    hash.update(value);
  }
  const seconds = Number(process.hrtime.bigint() - t) / 1e9;
  await closeDb();
  console.log(JSON.stringify({ seconds, maxRssMiB: process.resourceUsage().maxRSS / 1024, startRssMiB, bytes, sha256: hash.digest("hex") }));
}

async function main() {
  if (!process.env.CAIRN_TEST_SLOT) throw new Error("set CAIRN_TEST_SLOT so the bench uses a test slot's database, never the development one");
  const zipVersion = spawnSync("zip", ["-v"], { encoding: "utf8" });
  if (zipVersion.status !== 0) throw new Error("Info-ZIP zip is needed for the baseline: apt-get install -y zip");
  const count = Number(process.argv[2] ?? 50);
  const perFile = Number(process.argv[3] ?? 40) * MiB;

  const postgres = (await import("postgres")).default;
  const { db, closeDb } = await import("@/db/client");
  const s = await import("@/db/schema");
  const { runMigrations } = await import("@/db/migrate");
  const { originalKey } = await import("@/lib/storage/storage-keys");
  const { diskPath: storePath } = await import("@/tests/support/stored-files"); // the benchmark hard-links files into the disk store
  const { requestEvidencePackage } = await import("@/lib/evidence-packages/request-evidence-package");
  const { recordCustodyEvent } = await import("@/lib/custody/record-custody-event");
  const { eq } = await import("drizzle-orm");

  const admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
  const [{ exists }] = await admin`select to_regclass('public.evidence_packages') is not null as exists`;
  await admin.end();
  if (!exists) await runMigrations(TEST_ENV.MIGRATION_DATABASE_URL, TEST_ENV.DATABASE_URL);

  // a scratch organisation with one job, one flight, `count` recordings whose originals are in the store
  const stamp = Date.now();
  const [org] = await db().insert(s.organisations).values({ name: "Bench packaging crew", slug: `bench-package-${stamp}` }).returning();
  const [user] = await db().insert(s.users).values({ email: `bench-${stamp}@bench.example`, name: "Bench Packer" }).returning();
  await db().insert(s.memberships).values({ organisationId: org.id, userId: user.id, role: "owner" });
  const [client] = await db().insert(s.clients).values({ organisationId: org.id, name: "Bench client" }).returning();
  const [site] = await db().insert(s.sites).values({ organisationId: org.id, clientId: client.id, name: "Bench site" }).returning();
  const [job] = await db().insert(s.jobs).values({ organisationId: org.id, siteId: site.id, title: "Bench packaging job" }).returning();
  const [flight] = await db().insert(s.flights).values({ organisationId: org.id, jobId: job.id, flownOn: "2026-03-14" }).returning();

  // the random files are kept in a folder of their own and linked into this run's store keys
  const pool = path.join(BENCH_DIR, "originals");
  await mkdir(pool, { recursive: true });
  const genStart = process.hrtime.bigint();
  let made = 0;
  const files: { file: string; sha256: string }[] = [];
  for (let i = 0; i < count; i++) {
    const file = path.join(pool, `card-${String(i + 1).padStart(3, "0")}.264`);
    const shaFile = `${file}.sha256`;
    let sha: string;
    if (existsSync(file) && statSync(file).size === perFile && existsSync(shaFile)) {
      sha = execFileSync("cat", [shaFile]).toString().trim();
    } else {
      sha = await writeRandomFile(file, perFile);
      execFileSync("sh", ["-c", `printf %s ${sha} > '${shaFile}'`]);
      made++;
    }
    files.push({ file, sha256: sha });
  }
  if (made) console.log(`made ${made} random originals of ${perFile / MiB} MiB in ${(Number(process.hrtime.bigint() - genStart) / 1e9).toFixed(1)} s`);
  for (const [i, f] of files.entries()) {
    const [rec] = await db()
      .insert(s.recordings)
      .values({ organisationId: org.id, jobId: job.id, flightId: flight.id, originalName: path.basename(f.file), sizeBytes: perFile, kind: "raw_h264", sha256: f.sha256, state: "ready", sequenceIndex: i })
      .returning({ id: s.recordings.id });
    const key = originalKey(org.id, rec.id);
    await mkdir(path.dirname(storePath(key)), { recursive: true });
    execFileSync("ln", ["-f", f.file, storePath(key)]); // a hard link: the same bytes, no copy
    await db().update(s.recordings).set({ storageKey: key }).where(eq(s.recordings.id, rec.id));
    await recordCustodyEvent({ organisationId: org.id, eventType: "upload", evidenceType: "recording", evidenceId: rec.id, jobId: job.id, originalSha256: f.sha256, originalSize: perFile, actor: { userId: user.id, role: "owner" } });
  }
  const total = perFile * count;
  console.log(`job: ${count} recordings, ${(total / 1e9).toFixed(2)} GB of originals; ${execFileSync("nproc").toString().trim()} cores`);

  // warm the page cache the same way for everyone: read every original once
  execFileSync("sh", ["-c", `cat '${pool}'/*.264 > /dev/null`]);

  const out = path.join(BENCH_DIR, "out");
  await rm(out, { recursive: true, force: true });
  await mkdir(out, { recursive: true });
  const names = files.map((f) => path.basename(f.file));
  const zip0 = timed("zip", ["-q", "-0", path.join(out, "stored.zip"), ...names], pool);
  const zip0Bytes = statSync(path.join(out, "stored.zip")).size;
  await rm(path.join(out, "stored.zip"));
  const zip6 = timed("zip", ["-q", path.join(out, "deflated.zip"), ...names], pool);
  const zip6Bytes = statSync(path.join(out, "deflated.zip")).size;
  await rm(path.join(out, "deflated.zip"));

  const asked = await requestEvidencePackage({ organisationId: org.id, userId: user.id }, { jobId: job.id }, { enqueueJob: false });
  const built = child("build", asked.id);
  const [row] = await db().select({ storageKey: s.evidencePackages.storageKey }).from(s.evidencePackages).where(eq(s.evidencePackages.id, asked.id));
  const zipFile = storePath(row.storageKey!);
  if (sha256File(zipFile) !== built.sha256) throw new Error("the package on disk does not have the SHA-256 recorded");
  const served = child("serve", `${org.id}:${asked.id}:${user.id}`);
  if (served.sha256 !== built.sha256 || served.bytes !== built.bytes) throw new Error("the download did not deliver the package's bytes");
  // the bag checks out with Info-ZIP's own test of every entry's CRC-32
  const unzipTest = spawnSync("unzip", ["-tq", zipFile], { encoding: "utf8" });

  console.log("");
  console.log("                 seconds   throughput   output        peak RSS");
  console.log(`zip -0           ${zip0.toFixed(1).padStart(7)}   ${mb(total, zip0).padStart(10)}   ${(zip0Bytes / 1e9).toFixed(2)} GB       (Info-ZIP)`);
  console.log(`zip -6           ${zip6.toFixed(1).padStart(7)}   ${mb(total, zip6).padStart(10)}   ${(zip6Bytes / 1e9).toFixed(2)} GB       (Info-ZIP)`);
  console.log(`package (build)  ${built.seconds.toFixed(1).padStart(7)}   ${mb(total, built.seconds).padStart(10)}   ${(built.bytes / 1e9).toFixed(2)} GB       worker ${built.maxRssMiB.toFixed(0)} MiB (${built.startRssMiB.toFixed(0)} MiB before it started)`);
  console.log(`package download ${served.seconds.toFixed(1).padStart(7)}   ${mb(served.bytes, served.seconds).padStart(10)}   ${(served.bytes / 1e9).toFixed(2)} GB       web ${served.maxRssMiB.toFixed(0)} MiB (${served.startRssMiB.toFixed(0)} MiB before it started)`);
  console.log("");
  console.log(`package build / zip -0 time: ${(built.seconds / zip0).toFixed(2)}x   (the build also hashes every original, checks it against its upload SHA-256, and reads the finished ZIP back to hash it)`);
  console.log(`package build / zip -6 time: ${(built.seconds / zip6).toFixed(2)}x`);
  // bounded memory: what a process grew by while moving the whole package, against the package's size
  console.log(`memory grown while streaming ${(built.bytes / 1e9).toFixed(2)} GB: worker +${(built.maxRssMiB - built.startRssMiB).toFixed(0)} MiB, web +${(served.maxRssMiB - served.startRssMiB).toFixed(0)} MiB (peak RSS less RSS at start)`);
  console.log(`unzip -t of the package: ${unzipTest.status === 0 ? "no errors" : `FAILED: ${unzipTest.stdout}${unzipTest.stderr}`}`);

  await rm(zipFile, { force: true });
  await rm(path.join(BENCH_DIR, "storage"), { recursive: true, force: true });
  await rm(out, { recursive: true, force: true });
  await closeDb();
  const { closeRedis } = await import("@/lib/queue/redis");
  await closeRedis().catch(() => {});
}

const role = process.argv[2];
(role === "--build" ? buildChild(process.argv[3]) : role === "--serve" ? serveChild(process.argv[3]) : main()).catch((err) => {
  console.error(err);
  process.exit(1);
});
