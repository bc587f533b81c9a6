// The tus endpoint over real HTTP, driven by tus-js-client (an independent tus 1.0.0 client) and by
// raw requests checked against the tus protocol (tus.io protocol.md, 1.0.0). Hashes are checked
// with GNU coreutils' sha256sum, which shares no code with ours.
import { readFile, stat } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, queue } from "@/lib/queue/jobs";
import { diskPath, onDiskStore, storedSha256 } from "@/tests/support/stored-files";
import { originalKey } from "@/lib/storage/storage-keys";
import { recordingIdForUpload } from "@/lib/uploads/recording-id-for-upload";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { startUploadServer } from "@/tests/support/upload-server";
import { makePaddedRawH264, makeRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, dropMidPatch, encodeMetadata, metadataFor, stagedDataSize, stagedPrefix, stagingFiles, tusRequest, tusUpload, uploadIdOf, type Target } from "./upload-helpers";
import { env } from "@/lib/config/env";

let actors: Record<DemoActorKey, Actor>;
let base: string;
let close: () => Promise<void>;
let target: Target;
let otherTarget: Target;
let pilot: Record<string, string>;

beforeAll(async () => {
  actors = await demoActors();
  const flight = await makeFlight(actors.pilot!.organisationId);
  target = { jobId: flight.jobId, flightId: flight.id };
  const other = await makeFlight(actors.other!.organisationId);
  otherTarget = { jobId: other.jobId, flightId: other.id };
  pilot = await cookieOf(actors.pilot);
  ({ url: base, close } = await startUploadServer());
});
afterAll(async () => {
  await close();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

/** Creates an upload with a raw POST and returns its path (/api/uploads/<id>). */
async function create(size: number, filename: string, headers = pilot, t = target): Promise<string> {
  const res = await tusRequest(base, "POST", "/api/uploads", { headers: { ...headers, "Upload-Length": String(size), "Upload-Metadata": encodeMetadata(metadataFor(t, filename)) } });
  expect(res.status, await res.clone().text()).toBe(201);
  return res.headers.get("location")!;
}

async function headOffset(location: string, headers = pilot): Promise<number> {
  const res = await tusRequest(base, "HEAD", location, { headers });
  expect(res.status).toBe(200);
  expect(res.headers.get("cache-control")).toBe("no-store"); // protocol.md, HEAD
  return Number(res.headers.get("upload-offset"));
}

describe("a 200 MB recording over a dropping link", () => {
  it("is aborted midway, resumed from the server's offset, and stored byte-exact", async () => {
    const size = 200 * 1000 * 1000;
    const file = await makePaddedRawH264(size, "resume");
    const reference = await sha256sum(file);
    const chunk = 4 * 1024 * 1024;

    const first = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(target, "REC_0001.264"), headers: pilot, chunkSize: chunk, abortAfterBytes: size / 2 });
    const location = new URL(first.url).pathname;
    const serverOffset = await headOffset(location);
    expect(serverOffset).toBeGreaterThan(0);
    expect(serverOffset).toBeLessThan(size);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(serverOffset);

    const second = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(target, "REC_0001.264"), headers: pilot, chunkSize: chunk, uploadUrl: first.url });
    // resumed, not restarted: tus-js-client never reports fewer bytes than the server already had
    expect(Math.min(...second.progress)).toBeGreaterThanOrEqual(serverOffset);
    expect(second.url).toBe(first.url);
    expect(second.headers["Cairn-Upload-Outcome"]).toBe("stored");
    expect(second.headers["Cairn-Original-SHA256"]).toBe(reference);

    const uploadId = uploadIdOf(location);
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, uploadId));
    expect(row).toMatchObject({ sha256: reference, sizeBytes: size, kind: "raw_h264", originalName: "REC_0001.264", state: "waiting", flightId: target.flightId });
    expect(row.id).toBe(recordingIdForUpload(uploadId));

    // the original left the staging folder for its write-once key, read-only, byte-exact
    const stored = originalKey(row.organisationId, row.id);
    expect(row.storageKey).toBe(stored);
    expect(await storedSha256(stored)).toBe(reference);
    if (onDiskStore()) expect((await stat(diskPath(stored))).mode & 0o777).toBe(0o444);
    expect(await stagedDataSize(uploadId)).toBeNull();

    // one custody event for it, and a processing job with the deterministic id
    const events = await db().select().from(custodyEvents).where(and(eq(custodyEvents.evidenceId, row.id), eq(custodyEvents.eventType, "upload")));
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ originalSha256: reference, originalSize: size, actorUserId: actors.pilot!.userId, storageLocation: row.storageKey });
    const job = await queue("process-recording").getJob(`process-recording.${row.id}`);
    expect(job?.data).toEqual({ recordingId: row.id });

    // after the upload, HEAD still reports it complete (a client retrying late must not start over)
    expect(await headOffset(location)).toBe(size);
  }, 240_000);
});

describe("a link that drops in the middle of a PATCH", () => {
  it("keeps the bytes that arrived; the resumed upload goes on from there and is stored byte-exact", async () => {
    const size = 24 * 1024 * 1024;
    const file = await makePaddedRawH264(size, "drop-mid-patch");
    const reference = await sha256sum(file);
    const source = await readFile(file);
    const location = await create(size, "REC_0007.264");
    const uploadId = uploadIdOf(location);

    // one PATCH announcing the whole file; the socket dies after 10 MiB have been sent
    const sent = 10 * 1024 * 1024;
    const offset = await dropMidPatch({ base, location, source, announced: size, sent, headers: pilot });
    expect(offset).toBeGreaterThanOrEqual(sent - 2 * 1024 * 1024);
    expect(offset).toBeLessThanOrEqual(sent);
    expect(await stagedDataSize(uploadId)).toBe(offset);
    // what was kept is exactly the start of the file
    expect(Buffer.compare(await stagedPrefix(uploadId, offset), source.subarray(0, offset))).toBe(0);

    const resumed = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(target, "REC_0007.264"), headers: pilot, uploadUrl: `${base}${location}` });
    expect(Math.min(...resumed.progress)).toBeGreaterThanOrEqual(offset);
    expect(resumed.headers["Cairn-Upload-Outcome"]).toBe("stored");
    expect(resumed.headers["Cairn-Original-SHA256"]).toBe(reference);
  }, 120_000);
});

describe("protocol", () => {
  it("OPTIONS advertises tus 1.0.0 with creation, termination and expiration, and the size limit", async () => {
    const res = await tusRequest(base, "OPTIONS", "/api/uploads", { tus: false });
    expect(res.status).toBe(204);
    expect(res.headers.get("tus-version")).toBe("1.0.0");
    const ext = res.headers.get("tus-extension")!.split(",");
    for (const e of ["creation", "termination", "expiration"]) expect(ext).toContain(e);
    expect(Number(res.headers.get("tus-max-size"))).toBe(20 * 1024 ** 3); // default UPLOAD_MAX_BYTES: 20 GiB
  });

  it("POST answers 201 with a Location and Tus-Resumable; HEAD gives offset 0 and the length", async () => {
    const location = await create(1000, "a.264");
    expect(location).toMatch(/^\/api\/uploads\/[0-9a-f]{32}$/);
    const res = await tusRequest(base, "HEAD", location, { headers: pilot });
    expect(res.headers.get("tus-resumable")).toBe("1.0.0");
    expect(res.headers.get("upload-offset")).toBe("0");
    expect(res.headers.get("upload-length")).toBe("1000");
    expect(res.headers.get("upload-expires")).toBeNull(); // only PATCH/POST carry it
  });

  it("PATCH with a wrong Content-Type answers 415 and changes nothing", async () => {
    const location = await create(1000, "b.264");
    const res = await tusRequest(base, "PATCH", location, { headers: { ...pilot, "Upload-Offset": "0", "Content-Type": "application/octet-stream" }, body: new Uint8Array(100) });
    expect(res.status).toBe(415);
    expect(res.headers.get("tus-resumable")).toBe("1.0.0");
    expect((await res.json()).error.message).toMatch(/application\/offset\+octet-stream/);
    expect(await headOffset(location)).toBe(0);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(0);
  });

  it("PATCH at a wrong offset answers 409 and changes nothing", async () => {
    const location = await create(3000, "c.264");
    const patch = (offset: number, body: Uint8Array) =>
      tusRequest(base, "PATCH", location, { headers: { ...pilot, "Upload-Offset": String(offset), "Content-Type": "application/offset+octet-stream" }, body });
    // a raw H.264 head so the early content check passes
    const h264 = await readFile(await makeRawH264({ seconds: 1 }));
    const first = await patch(0, h264.subarray(0, 1000));
    expect(first.status).toBe(204);
    expect(first.headers.get("upload-offset")).toBe("1000");
    expect(first.headers.get("upload-expires")).toBeTruthy(); // expiration extension
    const wrong = await patch(500, h264.subarray(1000, 1800));
    expect(wrong.status).toBe(409);
    expect(await headOffset(location)).toBe(1000);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(1000);
    const staged = await readFile(path.join(env().uploadDir, uploadIdOf(location)));
    expect(Buffer.compare(staged, h264.subarray(0, 1000))).toBe(0);
  });

  it("DELETE ends an unfinished upload (termination) and removes its bytes", async () => {
    const location = await create(1000, "d.264");
    const res = await tusRequest(base, "DELETE", location, { headers: pilot });
    expect(res.status).toBe(204);
    expect(await stagedDataSize(uploadIdOf(location))).toBeNull();
    expect((await tusRequest(base, "HEAD", location, { headers: pilot })).status).toBe(404);
  });

  it("requests without Tus-Resumable are refused with 412", async () => {
    const res = await tusRequest(base, "POST", "/api/uploads", { tus: false, headers: { ...pilot, "Upload-Length": "10" } });
    expect(res.status).toBe(412);
  });
});

describe("who may upload", () => {
  it("without a session: 401 on creation and on every request of an existing upload", async () => {
    const location = await create(1000, "e.264");
    const post = await tusRequest(base, "POST", "/api/uploads", { headers: { "Upload-Length": "1000", "Upload-Metadata": encodeMetadata(metadataFor(target, "x.264")) } });
    expect(post.status).toBe(401);
    expect((await post.json()).error.message).toBe("Sign in to upload recordings");
    expect((await tusRequest(base, "HEAD", location)).status).toBe(401);
    expect((await tusRequest(base, "PATCH", location, { headers: { "Upload-Offset": "0", "Content-Type": "application/offset+octet-stream" }, body: new Uint8Array(10) })).status).toBe(401);
    expect((await tusRequest(base, "DELETE", location)).status).toBe(401);
    expect((await tusRequest(base, "GET", location, { tus: false })).status).toBe(401);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(0);
  });

  it.each(["reviewer", "client"] as const)("a %s (no upload permission) gets 403", async (who) => {
    const res = await tusRequest(base, "POST", "/api/uploads", { headers: { ...(await cookieOf(actors[who])), "Upload-Length": "1000", "Upload-Metadata": encodeMetadata(metadataFor(target, "x.264")) } });
    expect(res.status).toBe(403);
  });

  it("the owner may upload too", async () => {
    await create(1000, "owner.264", await cookieOf(actors.owner));
  });

  it("another organisation's flight is refused at creation, nothing staged", async () => {
    const before = await stagingFiles();
    const res = await tusRequest(base, "POST", "/api/uploads", { headers: { ...pilot, "Upload-Length": "1000", "Upload-Metadata": encodeMetadata(metadataFor(otherTarget, "x.264")) } });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.message).toBe("Flight not found in your organisation");
    expect(body.error.fields.flightId).toBeDefined();
    expect(await stagingFiles()).toEqual(before);
  });

  it("another organisation cannot see, continue, cancel or read the outcome of an upload: 404", async () => {
    const location = await create(1000, "f.264");
    const stranger = await cookieOf(actors.other);
    expect((await tusRequest(base, "HEAD", location, { headers: stranger })).status).toBe(404);
    const patch = await tusRequest(base, "PATCH", location, { headers: { ...stranger, "Upload-Offset": "0", "Content-Type": "application/offset+octet-stream" }, body: new Uint8Array(10) });
    expect(patch.status).toBe(404);
    expect((await tusRequest(base, "DELETE", location, { headers: stranger })).status).toBe(404);
    expect((await tusRequest(base, "GET", location, { headers: stranger, tus: false })).status).toBe(404);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(0);
  });
});

describe("the tus GET is not a door to the file", () => {
  it("GET of a finished upload answers its outcome as JSON, never the bytes", async () => {
    const file = await makeRawH264({ seconds: 1, pattern: "smptebars" });
    const run = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(target, "bars.264"), headers: pilot });
    const res = await tusRequest(base, "GET", new URL(run.url).pathname, { headers: pilot, tus: false });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/json");
    const body = await res.json();
    expect(body).toMatchObject({ state: "stored", fileName: "bars.264", sha256: await sha256sum(file), kind: "raw_h264" });
  });
});
