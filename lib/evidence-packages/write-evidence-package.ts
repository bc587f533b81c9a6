// Builds one evidence package's ZIP into the store (run by the worker's "build-evidence-package" job):
// reads what the package holds (collect-package-contents.ts), makes sure a custody checkpoint covers its
// events, checks the free disk, streams the bag into a temporary file beside its final place
// (write-bag-zip.ts), reads the finished file back to verify its SHA-256, then renames it into place
// read-only. The originals' bytes are checked against the SHA-256 recorded at upload on the way.
import "server-only";
import { createReadStream, createWriteStream } from "node:fs";
import { open, rm } from "node:fs/promises";
import { createHash } from "node:crypto";
import { Readable } from "node:stream";
import { and, asc, count, desc, eq, gte, max, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { custodyCheckpoints, custodyEvents, users } from "@/db/schema";
import type { CustodyCheckpoint, EvidencePackage } from "@/db/schema/types";
import { csvRecord } from "@/lib/csv/write-csv";
import { custodyCsvHeader, custodyCsvRow, custodyJsonEvent, HASH_RULE, type ExportedEvent } from "@/lib/custody/export-custody-log";
import { checkpointStatement } from "@/lib/custody/checkpoint-statement";
import { eventsInChainOrder } from "@/lib/custody/list-custody-events";
import { makeCheckpoint } from "@/lib/custody/make-checkpoint";
import { localSpaceFolder, putStoredFile, readKey } from "@/lib/storage/store";
import { scratchFile } from "@/lib/storage/scratch";
import { evidencePackageKey } from "@/lib/storage/storage-keys";
import { collectPackageContents, estimatePackageBytes, packageTrailCondition, type PackageContents } from "./collect-package-contents";
import { checkFreeSpace } from "./check-free-space";
import { bagName } from "./package-layout";
import { bagInfo, readme, type PackageFacts } from "./package-texts";
import { packageSettings } from "./package-settings";
import { writeBagZip, type BagPayloadEntry } from "./write-bag-zip";

export type WrittenPackage = {
  storageKey: string;
  sizeBytes: number;
  sha256: string;
  payloadFiles: number;
  payloadBytes: number;
  bagName: string;
  custodyEvents: number;
  checkpointNumber: number | null;
};

export class PackageVerifyError extends Error {}

const selectionOf = (p: EvidencePackage) => ({ jobId: p.jobId, flightId: p.flightId, recordingIds: p.recordingIds });

/** The package's events up to `maxSeq`: the chain position counted and checkpointed before writing. */
async function* trailEvents(organisationId: string, contents: PackageContents, maxSeq: number, pageSize = 2000): AsyncGenerator<ExportedEvent> {
  yield* eventsInChainOrder(and(packageTrailCondition(organisationId, contents), sql`${custodyEvents.seq} <= ${maxSeq}`), pageSize);
}

/** The first checkpoint whose chain head is at or after `seq`; made now when none is (null if that fails). */
async function coveringCheckpoint(organisationId: string, seq: number): Promise<{ checkpoint: CustodyCheckpoint | null; covers: boolean }> {
  const first = async () =>
    (await db().select().from(custodyCheckpoints).where(and(eq(custodyCheckpoints.organisationId, organisationId), gte(custodyCheckpoints.headSeq, seq))).orderBy(asc(custodyCheckpoints.number)).limit(1))[0];
  let found = await first();
  if (!found) {
    await makeCheckpoint(organisationId).catch((err) => console.warn(`[packages] no checkpoint could be made now: ${(err as Error).message}`));
    found = await first();
  }
  if (found) return { checkpoint: found, covers: true };
  const [latest] = await db().select().from(custodyCheckpoints).where(eq(custodyCheckpoints.organisationId, organisationId)).orderBy(desc(custodyCheckpoints.number)).limit(1);
  return { checkpoint: latest ?? null, covers: false };
}

function textStream(parts: () => AsyncGenerator<string>): () => Readable {
  return () => Readable.from((async function* () {
    for await (const s of parts()) yield Buffer.from(s, "utf8");
  })());
}

async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash("sha256");
  for await (const chunk of createReadStream(file, { highWaterMark: 1024 * 1024 })) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

export async function writeEvidencePackage(pkg: EvidencePackage, opts: { signal?: AbortSignal; onProgress?: (percent: number) => void; now?: Date } = {}): Promise<WrittenPackage> {
  const now = opts.now ?? new Date();
  const contents = await collectPackageContents(pkg.organisationId, selectionOf(pkg));
  const where = packageTrailCondition(pkg.organisationId, contents);
  const [{ n, top }] = await db().select({ n: count(), top: max(custodyEvents.seq) }).from(custodyEvents).where(where);
  const maxSeq = Number(top ?? 0);
  const { checkpoint, covers } = maxSeq > 0 ? await coveringCheckpoint(pkg.organisationId, maxSeq) : { checkpoint: null, covers: false };

  const settings = packageSettings();
  const estimate = estimatePackageBytes(contents, n);
  await checkFreeSpace(await localSpaceFolder(), estimate, settings.diskReserveBytes);

  const [maker] = pkg.createdBy ? await db().select({ name: users.name, email: users.email }).from(users).where(eq(users.id, pkg.createdBy)) : [];
  const name = bagName(contents.job.title, pkg.id, now);
  const facts: PackageFacts = {
    packageId: pkg.id,
    bagName: name,
    organisationName: contents.organisation.name,
    jobId: contents.job.id,
    jobTitle: contents.job.title,
    clientName: contents.job.clientName,
    siteName: contents.job.siteName,
    selection: contents.selection,
    flightFlownOn: contents.flight?.flownOn ?? null,
    recordingCount: contents.recordings.length,
    madeBy: maker ?? null,
    madeAt: now,
    purpose: pkg.purpose,
    legalHold: contents.job.legalHold,
    checkpoint: checkpoint ? { number: checkpoint.number, headSeq: checkpoint.headSeq, covers } : null,
    custodyEvents: n,
    custodyMaxSeq: maxSeq,
  };

  const entries: BagPayloadEntry[] = contents.files.map((f) => ({
    path: f.path,
    open: () => readKey(f.storageKey),
    size: f.sizeBytes,
    // originals must be the very bytes uploaded; derived files are checked against their record too
    expectSha256: f.sha256,
    store: f.store,
  }));
  const orgId = pkg.organisationId;
  entries.push(
    {
      path: "contents.csv",
      size: null,
      open: textStream(async function* () {
        yield csvRecord(["path", "kind", "evidenceId", "recordingId", "recordingOriginalName", "sizeBytes", "sha256RecordedByCairn"]);
        const names = new Map(contents.recordings.map((r) => [r.id, r.originalName]));
        for (const f of contents.files) yield csvRecord([`data/${f.path}`, f.kind, f.evidenceId, f.recordingId, f.recordingId ? names.get(f.recordingId) : null, f.sizeBytes, f.sha256]);
      }),
    },
    {
      path: "custody/custody-events.json",
      size: null,
      open: textStream(async function* () {
        const head = { organisation: { id: orgId, name: contents.organisation.name }, scope: `evidence-package-${pkg.id}`, job: { id: contents.job.id, title: contents.job.title }, exportedAt: now.toISOString(), exportedBy: maker?.email ?? null, hashRule: HASH_RULE };
        yield `${JSON.stringify(head).slice(0, -1)},"events":[`;
        let first = true;
        for await (const e of trailEvents(orgId, contents, maxSeq)) {
          yield `${first ? "" : ","}\n${JSON.stringify(custodyJsonEvent(e))}`;
          first = false;
        }
        yield "\n]}\n";
      }),
    },
    {
      path: "custody/custody-events.csv",
      size: null,
      open: textStream(async function* () {
        yield custodyCsvHeader();
        for await (const e of trailEvents(orgId, contents, maxSeq)) yield custodyCsvRow(e);
      }),
    },
  );
  if (checkpoint) {
    const statement = checkpointStatement(checkpoint);
    const record = {
      number: checkpoint.number,
      headSeq: checkpoint.headSeq,
      headEventId: checkpoint.headEventId,
      headHash: checkpoint.headHash,
      previousStatementSha256: checkpoint.previousStatementSha256,
      signedAt: checkpoint.signedAt.toISOString(),
      statement,
      signature: { algorithm: "Ed25519 (RFC 8032)", publicKeyBase64url: checkpoint.publicKey, signatureBase64url: checkpoint.signature, over: "the UTF-8 bytes of statement" },
      timestamp: checkpoint.tsaResponse ? { authority: checkpoint.tsaUrl, stampedAt: checkpoint.stampedAt?.toISOString() ?? null, response: "checkpoint-timestamp.tsr (RFC 3161 TimeStampResp, DER)" } : null,
      coversEveryEventInThisPackage: covers,
    };
    entries.push({ path: "custody/checkpoint.json", size: null, open: () => Readable.from([Buffer.from(JSON.stringify(record, null, 2) + "\n")]) });
    entries.push({ path: "custody/checkpoint-statement.json", size: null, open: () => Readable.from([Buffer.from(statement, "utf8")]) });
    if (checkpoint.tsaResponse) entries.push({ path: "custody/checkpoint-timestamp.tsr", size: null, open: () => Readable.from([Buffer.from(checkpoint.tsaResponse!, "base64")]) });
  }

  const key = evidencePackageKey(pkg.organisationId, pkg.id);
  const temp = await scratchFile(`package-${pkg.id}.zip`);
  const totalBytes = Math.max(1, contents.files.reduce((a, f) => a + f.sizeBytes, 0));
  let lastPercent = -1;
  try {
    const written = await writeBagZip(createWriteStream(temp, { flags: "wx" }), name, entries, { bagInfo: bagInfo(facts), readme: readme(facts) }, {
      now,
      signal: opts.signal,
      onBytes: (done) => {
        // 5..90 % while the payload streams; verifying the written file is the rest
        const percent = 5 + Math.floor((85 * Math.min(done, totalBytes)) / totalBytes);
        if (percent !== lastPercent) {
          lastPercent = percent;
          opts.onProgress?.(percent);
        }
      },
    });
    const fh = await open(temp, "r");
    try {
      await fh.sync();
    } finally {
      await fh.close();
    }
    opts.onProgress?.(92);
    // the package is a single verified file: what is on disk is what was hashed while writing
    const onDisk = await sha256OfFile(temp);
    if (onDisk !== written.zipSha256) throw new PackageVerifyError(`the written package reads back as SHA-256 ${onDisk}, not ${written.zipSha256}`);
    await putStoredFile(temp, key, { consume: true });
    opts.onProgress?.(98);
    return {
      storageKey: key,
      sizeBytes: written.zipBytes,
      sha256: written.zipSha256,
      payloadFiles: written.payloadFiles,
      payloadBytes: written.payloadBytes,
      bagName: name,
      custodyEvents: n,
      checkpointNumber: checkpoint?.number ?? null,
    };
  } catch (err) {
    await rm(temp, { force: true });
    throw err;
  }
}
