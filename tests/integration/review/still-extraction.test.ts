// The still of a finding at frame N is frame N: compared with the frame that ffmpeg decodes on its own
// by counting frames from the start (`select=eq(n\,N)`), pixel by pixel in 8-bit luma. The test pattern
// carries the frame number burned in, so a neighbouring frame differs clearly.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import * as list from "@/app/api/findings/route";
import * as stillRoute from "@/app/api/media/stills/[id]/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storedBytes, storedFileCopy } from "@/tests/support/stored-files";
import { extractStill } from "@/worker/handlers/extract-still";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { spawn } from "node:child_process";

let actors: Record<DemoActorKey, Actor>;
let rec: ProcessedRecording;
let playablePath: string;
const W = 320;
const H = 180;

/** ffmpeg decoding to raw 8-bit gray, stdout as bytes. */
function decodeGray(args: string[]): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const child = spawn("ffmpeg", ["-v", "error", ...args, "-f", "rawvideo", "-pix_fmt", "gray", "-"], { stdio: ["ignore", "pipe", "pipe"] });
    const chunks: Buffer[] = [];
    let err = "";
    child.stdout.on("data", (c: Buffer) => chunks.push(c));
    child.stderr.on("data", (c: Buffer) => (err += c));
    child.on("close", (code) => (code === 0 ? resolve(Buffer.concat(chunks)) : reject(new Error(err))));
  });
}
// ffmpeg's own frame counting from the start: the independent reference for "frame N"
const referenceFrame = (n: number) => decodeGray(["-i", playablePath, "-vf", `select=eq(n\\,${n})`, "-vsync", "0", "-frames:v", "1"]);
const meanAbsDiff = (a: Buffer, b: Buffer) => {
  expect(a.length).toBe(b.length);
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += Math.abs(a[i] - b[i]);
  return sum / a.length;
};

async function markAndExtract(frame: number) {
  const res = await list.POST(await req(actors.reviewer, "POST", "/api/findings", { recordingId: rec.recording.id, startFrame: frame, severity: "moderate" }));
  expect(res.status).toBe(201);
  const f = await res.json();
  expect(await extractStill({ stillId: f.still.id })).toBe("made");
  const [still] = await db().select().from(s.stills).where(eq(s.stills.id, f.still.id));
  return still;
}

beforeAll(async () => {
  actors = await demoActors();
  const orgId = await demoOrganisationId();
  rec = await makeProcessedRecording(orgId, await makeFlight(orgId), { seconds: 2, fps: 30, width: W, height: H, gop: 15 });
  // the demo client account may see this job (its client is tied to it)
  await tieClientAccount(actors.client!, await clientOf({ recordingId: rec.recording.id }));
  playablePath = await storedFileCopy(rec.renditions.find((r) => r.kind === "playable")!.storageKey);
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("frame-accurate stills", () => {
  // 0: the first frame; 22: mid-GOP (keyframes every 15 frames), so the seek must decode forward;
  // 45: a keyframe; 59: the last frame of 60
  it.each([0, 22, 45, 59])("the still of frame %i is ffmpeg's own decode of that frame, at full resolution", async (n) => {
    const still = await markAndExtract(n);
    expect(still.state).toBe("ready");
    expect([still.width, still.height]).toEqual([W, H]);
    const stored = await storedBytes(still.storageKey!);
    expect(createHash("sha256").update(stored).digest("hex")).toBe(still.sha256);
    const mine = await decodeGray(["-i", await storedFileCopy(still.storageKey!)]);
    const reference = await referenceFrame(n);
    const same = meanAbsDiff(mine, reference);
    // JPEG at -q:v 2 on a synthetic pattern: measured 0.36 to 0.44 levels of 255 on average
    expect(same).toBeLessThan(1.5);
    // and clearly not a neighbour: the burned-in counter and the moving pattern change every frame
    for (const neighbour of [n - 1, n + 1].filter((k) => k >= 0 && k < 60)) {
      const other = meanAbsDiff(mine, await referenceFrame(neighbour));
      if (process.env.CAIRN_PRINT_FIGURES) console.log(`frame ${n}: vs itself ${same.toFixed(3)}, vs ${neighbour} ${other.toFixed(3)}`);
      expect(other).toBeGreaterThan(same * 5); // measured 5.1 to 7.3
    }
  });

  it("is idempotent, recorded in the custody log once, and served through the media route with authorization", async () => {
    const still = await markAndExtract(10);
    expect(await extractStill({ stillId: still.id })).toBe("already-made");
    const events = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, still.id), eq(s.custodyEvents.eventType, "derived")));
    expect(events).toHaveLength(1);
    expect(events[0].outputSha256).toBe(still.sha256);
    expect(events[0].originalSha256).toBe(rec.recording.sha256);
    const ctx = { params: Promise.resolve({ id: still.id }) };
    const ok = await stillRoute.GET(await req(actors.client, "GET", `/api/media/stills/${still.id}`), ctx);
    expect(ok.status).toBe(200);
    expect(ok.headers.get("content-type")).toBe("image/jpeg");
    await ok.arrayBuffer();
    expect((await stillRoute.GET(await req(actors.other, "GET", "/x", undefined, { range: "bytes=0-9" }), { params: Promise.resolve({ id: still.id }) })).status).toBe(404);
    expect((await stillRoute.GET(await req(null, "GET", "/x", undefined, { range: "bytes=0-9" }), { params: Promise.resolve({ id: still.id }) })).status).toBe(401);
  });

  it("a still whose row is gone ends quietly; a broken source fails the still and rethrows for a retry", async () => {
    expect(await extractStill({ stillId: "00000000-0000-4000-8000-000000000000" })).toBe("gone");
    const res = await list.POST(await req(actors.reviewer, "POST", "/api/findings", { recordingId: rec.recording.id, startFrame: 5, severity: "minor" }));
    const f = await res.json();
    const playable = rec.renditions.find((r) => r.kind === "playable")!;
    await db().update(s.renditions).set({ storageKey: playable.storageKey.replace("playable.mp4", "missing.mp4") }).where(eq(s.renditions.id, playable.id));
    try {
      await expect(extractStill({ stillId: f.still.id })).rejects.toThrow();
      const [row] = await db().select().from(s.stills).where(eq(s.stills.id, f.still.id));
      expect(row.state).toBe("failed");
      expect(row.failureReason).toBeTruthy();
    } finally {
      await db().update(s.renditions).set({ storageKey: playable.storageKey }).where(eq(s.renditions.id, playable.id));
    }
    // the retry succeeds once the source is back
    expect(await extractStill({ stillId: f.still.id })).toBe("made");
  });
});
