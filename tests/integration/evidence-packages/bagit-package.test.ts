// An evidence package checked from outside Cairn: unpacked with Info-ZIP unzip, its manifests checked
// with GNU coreutils `sha256sum -c`, the bag validated by the Library of Congress's bagit-python
// (`python3 -m bagit --validate`, an independent RFC 8493 implementation), the ZIP's own SHA-256 by
// Node's crypto. A byte changed inside the ZIP is caught by both checkers.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { readFile, readdir, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { storedFileCopy } from "@/tests/support/stored-files";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { demoActors, demoOrganisationId, type Actor, type DemoActorKey } from "@/tests/support/session";
import { buildPackage, hasPythonBagit, jobWithEvidence, tryRun, unzipTo } from "./package-fixture";

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let owner: { organisationId: string; userId: string };
let job: Awaited<ReturnType<typeof jobWithEvidence>>;
let zipPath: string;
let zip: Buffer;
let bagDir: string;
let pythonBagit = false;
const cleanup: string[] = [];

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  owner = actors.owner!;
  job = await jobWithEvidence(orgId, owner.userId);
  pythonBagit = await hasPythonBagit();
  if (!pythonBagit) console.warn("[bagit-package.test] Python's bagit is not installed: `pip install bagit` (bagit-python) to run its validation here");
  const { outcome, row } = await buildPackage(owner, { jobId: job.jobId });
  expect(outcome).toBe("built");
  zipPath = await storedFileCopy(row.storageKey!);
  zip = await readFile(zipPath);
  const dir = await unzipTo(zipPath);
  cleanup.push(dir);
  const [top] = await readdir(dir);
  bagDir = path.join(dir, top);
}, 60_000);

afterAll(async () => {
  for (const d of cleanup) await rm(d, { recursive: true, force: true });
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("a job's evidence package", () => {
  it("is one ready file whose SHA-256 (Node's crypto) and size are the ones recorded", async () => {
    const [row] = await db().select().from(s.evidencePackages).where(and(eq(s.evidencePackages.jobId, job.jobId), eq(s.evidencePackages.state, "ready")));
    expect(row.sha256).toBe(sha256(zip));
    expect(row.sizeBytes).toBe(zip.length);
    expect(row.progress).toBe(100);
    // 2 originals, 4 renditions each, 2 stills, 1 report, contents.csv, custody JSON + CSV, checkpoint (3 files)
    expect(row.payloadFiles).toBe(2 + 8 + 2 + 1 + 1 + 2 + 3);
  });

  it("passes `sha256sum -c` on its payload manifest and its tag manifest (GNU coreutils)", async () => {
    const payload = await tryRun("sha256sum", ["-c", "--strict", "manifest-sha256.txt"], bagDir);
    expect(payload.code, payload.out).toBe(0);
    expect(payload.out.match(/: OK$/gm)?.length).toBe(19);
    const tags = await tryRun("sha256sum", ["-c", "--strict", "tagmanifest-sha256.txt"], bagDir);
    expect(tags.code, tags.out).toBe(0);
    expect(tags.out).toMatch(/README\.txt: OK/);
    expect(tags.out).toMatch(/bag-info\.txt: OK/);
  });

  it("validates with bagit-python (`python3 -m bagit --validate`), an independent BagIt implementation", async (ctx) => {
    if (!pythonBagit) ctx.skip();
    const res = await tryRun("python3", ["-m", "bagit", "--validate", bagDir]);
    expect(res.code, res.out).toBe(0);
    expect(res.out).toMatch(/is valid/);
  });

  it("holds the originals byte for byte, the renditions, stills and the approved report", async () => {
    const files = (await tryRun("find", [".", "-type", "f"], bagDir)).out.split("\n").filter(Boolean);
    const original = (id: string) => files.find((f) => f.includes(id) && f.includes("/original/"))!;
    expect(await readFile(path.join(bagDir, original(job.recA.id)))).toEqual(job.recA.originalBytes);
    expect(await readFile(path.join(bagDir, original(job.recB.id)))).toEqual(job.recB.originalBytes);
    expect(original(job.recA.id)).toMatch(/original\/tower-pass-1\.264$/);
    expect(files.filter((f) => f.includes("/renditions/"))).toHaveLength(8);
    expect(files.filter((f) => f.includes("/stills/"))).toHaveLength(2);
    const report = files.find((f) => f.startsWith("./data/reports/"))!;
    expect(await readFile(path.join(bagDir, report))).toEqual(job.pdf);
  });

  it("names the organisation, the job, who made it and when in bag-info.txt, and explains itself in README.txt", async () => {
    const info = await readFile(path.join(bagDir, "bag-info.txt"), "utf8");
    expect(info).toMatch(/^Source-Organization: Kestrelmoor/m);
    const [jobRow] = await db().select({ title: s.jobs.title }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
    expect(info).toContain(`Cairn-Job-Title: ${jobRow.title}`);
    expect(info).toContain(`Cairn-Job-Id: ${job.jobId}`);
    expect(info).toMatch(/^Cairn-Packaged-By: .+ <owner@kestrelmoor\.example>$/m);
    expect(info).toMatch(/^Cairn-Packaged-At: \d{4}-\d\d-\d\dT/m);
    // RFC 8493 2.2.2: Payload-Oxum is octetcount.streamcount of the payload
    const manifest = (await readFile(path.join(bagDir, "manifest-sha256.txt"), "utf8")).trim().split("\n");
    let octets = 0;
    for (const line of manifest) octets += (await readFile(path.join(bagDir, line.slice(66)))).length;
    expect(info).toContain(`Payload-Oxum: ${octets}.${manifest.length}`);
    const readme = await readFile(path.join(bagDir, "README.txt"), "utf8");
    expect(readme).toContain("sha256sum -c manifest-sha256.txt");
    expect(readme).toContain("RFC 8493");
  });

  it("carries the custody events of everything inside (JSON and CSV) and the checkpoint that covers them", async () => {
    const trail = JSON.parse(await readFile(path.join(bagDir, "data/custody/custody-events.json"), "utf8"));
    const uploads = trail.events.filter((e: { eventType: string }) => e.eventType === "upload").map((e: { evidenceId: string }) => e.evidenceId);
    expect(uploads).toEqual(expect.arrayContaining([job.recA.id, job.recB.id]));
    const csv = await readFile(path.join(bagDir, "data/custody/custody-events.csv"), "utf8");
    expect(csv.trim().split("\n")).toHaveLength(trail.events.length + 1);
    const maxSeq = Math.max(...trail.events.map((e: { seq: number }) => e.seq));
    const checkpoint = JSON.parse(await readFile(path.join(bagDir, "data/custody/checkpoint.json"), "utf8"));
    expect(checkpoint.headSeq).toBeGreaterThanOrEqual(maxSeq);
    expect(checkpoint.coversEveryEventInThisPackage).toBe(true);
    expect(await readFile(path.join(bagDir, "data/custody/checkpoint-statement.json"), "utf8")).toBe(checkpoint.statement);
  });

  it("is recorded once in the custody chain with the ZIP's SHA-256", async () => {
    const [row] = await db().select().from(s.evidencePackages).where(and(eq(s.evidencePackages.jobId, job.jobId), eq(s.evidencePackages.state, "ready")));
    const events = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, row.id), eq(s.custodyEvents.eventType, "package_built")));
    expect(events).toHaveLength(1);
    expect(events[0].outputSha256).toBe(sha256(zip));
    expect(events[0].actorUserId).toBe(owner.userId);
  });

  it("a byte changed inside the ZIP is caught by sha256sum -c and by bagit-python", async () => {
    // the original is stored uncompressed, so its bytes stand in the ZIP as they are: change one
    const needle = job.recA.originalBytes.subarray(100, 164);
    const at = zip.indexOf(needle);
    expect(at).toBeGreaterThan(0);
    const tampered = Buffer.from(zip);
    tampered[at + 10] ^= 0x01;
    const tamperedZip = path.join(path.dirname(bagDir), "..", `tampered-${Date.now()}.zip`);
    await writeFile(tamperedZip, tampered);
    cleanup.push(tamperedZip);
    const dir = await unzipTo(tamperedZip);
    cleanup.push(dir);
    const [top] = await readdir(dir);
    const bad = path.join(dir, top);
    const check = await tryRun("sha256sum", ["-c", "--quiet", "manifest-sha256.txt"], bad);
    expect(check.code).not.toBe(0);
    expect(check.out).toMatch(/tower-pass-1\.264: FAILED/);
    if (pythonBagit) {
      const res = await tryRun("python3", ["-m", "bagit", "--validate", bad]);
      expect(res.code).not.toBe(0);
      expect(res.out).toMatch(/tower-pass-1\.264/);
    }
  });
});
