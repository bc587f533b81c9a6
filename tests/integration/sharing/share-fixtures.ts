// Test evidence for sharing and custody tests: a job with recordings whose original and derived
// files really sit in the test store, findings with stills, and a built report. Rows are inserted
// directly (the ingest and processing paths are tested elsewhere); file bytes are small and their
// SHA-256 is computed here with Node's crypto, so downloads can be checked byte for byte.
import { createHash, randomUUID } from "node:crypto";
import { chmod } from "node:fs/promises";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { diskPath, onDiskStore, writeStoredBytes } from "@/tests/support/stored-files";
import { derivedKey, originalKey } from "@/lib/storage/storage-keys";
import { makeFlight } from "@/tests/support/factories";

export const sha256 = (b: Buffer | string) => createHash("sha256").update(b).digest("hex");

export async function putFile(key: string, bytes: Buffer | string, readOnly = false) {
  await writeStoredBytes(key, bytes);
  if (readOnly && onDiskStore()) await chmod(diskPath(key), 0o444); // originals are read-only on disk
}

export type FixtureRecording = { id: string; originalBytes: Buffer; sha256: string; originalKey: string; renditionKeys: Record<string, string> };

export async function makeStoredRecording(
  organisationId: string,
  jobId: string,
  flightId: string,
  opts: { name?: string; playable?: Buffer; image?: Buffer; durationSec?: number; sequenceIndex?: number } = {},
): Promise<FixtureRecording> {
  const id = randomUUID();
  const originalBytes = Buffer.concat([Buffer.from([0, 0, 0, 1, 0x67, 0x42]), Buffer.from(`controller stream ${id} `.repeat(40))]);
  const key = originalKey(organisationId, id);
  await putFile(key, originalBytes, true);
  const hash = sha256(originalBytes);
  await db()
    .insert(s.recordings)
    .values({
      id,
      organisationId,
      jobId,
      flightId,
      originalName: opts.name ?? `flight-${id.slice(0, 4)}.264`,
      sizeBytes: originalBytes.length,
      kind: "raw_h264",
      sha256: hash,
      storageKey: key,
      state: "ready",
      progress: 100,
      durationSec: opts.durationSec ?? 4,
      facts: { codec: "h264", width: 432, height: 240, fps: 30, durationSec: opts.durationSec ?? 4 },
      sequenceIndex: opts.sequenceIndex ?? 0,
      processedAt: new Date(),
    });
  const files: Record<string, { file: string; mime: string; bytes: Buffer }> = {
    playable: { file: "playable.mp4", mime: "video/mp4", bytes: opts.playable ?? Buffer.from(`mp4 bytes of ${id} `.repeat(300)) },
    poster: { file: "poster.jpg", mime: "image/jpeg", bytes: opts.image ?? Buffer.from(`jpeg poster ${id}`) },
    sprite: { file: "sprite.jpg", mime: "image/jpeg", bytes: opts.image ?? Buffer.from(`jpeg sprite ${id}`) },
    thumbnails_vtt: { file: "thumbnails.vtt", mime: "text/vtt", bytes: Buffer.from("WEBVTT\n\n00:00:00.000 --> 00:00:02.000\nsprite.jpg#xywh=0,0,160,90\n\n00:00:02.000 --> 00:00:04.000\nsprite.jpg#xywh=160,0,160,90\n") },
  };
  const renditionKeys: Record<string, string> = {};
  for (const [kind, f] of Object.entries(files)) {
    const k = derivedKey(organisationId, id, f.file);
    await putFile(k, f.bytes);
    renditionKeys[kind] = k;
    await db()
      .insert(s.renditions)
      .values({ organisationId, recordingId: id, kind: kind as "playable", storageKey: k, mimeType: f.mime, sizeBytes: f.bytes.length, sha256: sha256(f.bytes), tool: "ffmpeg", toolArgs: ["-c", "copy"] });
  }
  return { id, originalBytes, sha256: hash, originalKey: key, renditionKeys };
}

export async function makeFindingWithStill(
  organisationId: string,
  jobId: string,
  recordingId: string,
  opts: { startSec?: number; severity?: "minor" | "major" | "critical"; note?: string; image?: Buffer } = {},
) {
  const startSec = opts.startSec ?? 1.5;
  const [category] = await db().select({ id: s.findingCategories.id }).from(s.findingCategories).where(eq(s.findingCategories.organisationId, organisationId)).limit(1);
  const [finding] = await db()
    .insert(s.findings)
    .values({
      organisationId,
      jobId,
      recordingId,
      startFrame: Math.round(startSec * 30),
      startSec,
      severity: opts.severity ?? "major",
      categoryId: category?.id ?? null,
      note: opts.note ?? "Hairline crack along the mortar joint",
    })
    .returning();
  const stillId = randomUUID();
  const key = derivedKey(organisationId, recordingId, `still-${stillId}.jpg`);
  const bytes = opts.image ?? Buffer.from(`jpeg still ${stillId}`);
  await putFile(key, bytes);
  await db()
    .insert(s.stills)
    .values({ id: stillId, organisationId, recordingId, findingId: finding.id, frameNumber: finding.startFrame, timeSec: startSec, state: "ready", storageKey: key, sha256: sha256(bytes), width: 432, height: 240 });
  return { finding, stillId };
}

export async function makeReport(organisationId: string, jobId: string, opts: { pdf?: Buffer; state?: "ready" | "approved"; version?: number } = {}) {
  const id = randomUUID();
  const pdf = opts.pdf ?? Buffer.from("%PDF-1.4\n% test report\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n");
  const key = `reports/${organisationId}/${id}/report.pdf`;
  await putFile(key, pdf);
  const existing = await db().$count(s.reports, eq(s.reports.jobId, jobId));
  const [row] = await db()
    .insert(s.reports)
    .values({
      id,
      organisationId,
      jobId,
      version: opts.version ?? existing + 1,
      state: opts.state ?? "approved",
      progress: 100,
      storageKey: key,
      sizeBytes: pdf.length,
      sha256: sha256(pdf),
      approvedAt: (opts.state ?? "approved") === "approved" ? new Date() : null,
    })
    .returning();
  return { report: row, pdf };
}

/** A job with two recordings (A, B), one finding with a still on each, and an approved report. */
export async function makeSharedJob(organisationId: string, opts: { playable?: Buffer; image?: Buffer; durationSec?: number; pdf?: Buffer } = {}) {
  const flight = await makeFlight(organisationId);
  const jobId = flight.jobId;
  const recA = await makeStoredRecording(organisationId, jobId, flight.id, { name: "tower-pass-1.264", playable: opts.playable, image: opts.image, durationSec: opts.durationSec, sequenceIndex: 0 });
  const recB = await makeStoredRecording(organisationId, jobId, flight.id, { name: "tower-pass-2.264", playable: opts.playable, image: opts.image, durationSec: opts.durationSec, sequenceIndex: 1 });
  const fA = await makeFindingWithStill(organisationId, jobId, recA.id, { startSec: 1.5, severity: "major", image: opts.image });
  const fB = await makeFindingWithStill(organisationId, jobId, recB.id, { startSec: 2.5, severity: "minor", note: "Loose ladder cage bolt", image: opts.image });
  const { report, pdf } = await makeReport(organisationId, jobId, { pdf: opts.pdf });
  return { jobId, flightId: flight.id, recA, recB, fA, fB, report, pdf };
}
