// The commit of a still on its own, without ffmpeg or the worker: a pending still becomes ready with
// its JPEG's key, size and SHA-256 and one custody event; a second commit (a job run twice) records
// nothing more.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { stillKey } from "@/lib/storage/storage-keys";
import { commitStill } from "@/lib/findings/commit-still";
import type { ExtractedFrame } from "@/lib/findings/extract-frame";
import { demoOrganisationId } from "@/tests/support/session";
import { makeRecordingWithOriginal } from "@/tests/support/factories";

let orgId: string;
let dir: string;
let rec: Awaited<ReturnType<typeof makeRecordingWithOriginal>>;

beforeAll(async () => {
  orgId = await demoOrganisationId();
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-commit-still-"));
  const original = path.join(dir, "FLIGHT.264");
  await writeFile(original, Buffer.from([0, 0, 0, 1, 0x67, 0x42]));
  rec = await makeRecordingWithOriginal(orgId, original);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await closeDb();
  await closeRedis();
});

const jpeg = Buffer.from("jpeg bytes of a still");
// the digest a reader of the file would compute (node:crypto)
const sha256 = createHash("sha256").update(jpeg).digest("hex");
const frame: ExtractedFrame = { width: 432, height: 240, ptsTime: 1.5, tool: "ffmpeg", args: ["-i", "{playable.mp4}", "{still.jpg}"] };
const eventsOf = (stillId: string) => db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, stillId), eq(s.custodyEvents.eventType, "derived")));

async function pendingStill() {
  const [still] = await db().insert(s.stills).values({ organisationId: orgId, recordingId: rec.id, frameNumber: 45, timeSec: 1.5 }).returning();
  return { still, made: { still, recording: rec, storageKey: stillKey(orgId, rec.id, still.id), frame, sha256 } };
}

describe("commitStill", () => {
  it("a pending still becomes ready with its key, size and digest, and one custody event", async () => {
    const { still, made } = await pendingStill();
    expect(await commitStill(made)).toBe(true);
    const [row] = await db().select().from(s.stills).where(eq(s.stills.id, still.id));
    expect(row).toMatchObject({ state: "ready", storageKey: stillKey(orgId, rec.id, still.id), width: 432, height: 240, sha256, failureReason: null });
    const events = await eventsOf(still.id);
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ evidenceType: "still", jobId: rec.jobId, originalSha256: rec.sha256, originalSize: rec.sizeBytes, outputSha256: sha256, storageLocation: row.storageKey, tool: "ffmpeg", toolArgs: frame.args });
    expect(events[0].details).toMatchObject({ recordingId: rec.id, frameNumber: 45, ptsTime: 1.5 });
  });

  it("a second commit of the same still (a job run twice) changes nothing and records nothing", async () => {
    const { still, made } = await pendingStill();
    expect(await commitStill(made)).toBe(true);
    const [before] = await db().select().from(s.stills).where(eq(s.stills.id, still.id));
    expect(await commitStill({ ...made, sha256: "0".repeat(64) })).toBe(false);
    const [after] = await db().select().from(s.stills).where(eq(s.stills.id, still.id));
    expect(after.sha256).toBe(before.sha256);
    expect(await eventsOf(still.id)).toHaveLength(1);
  });
});
