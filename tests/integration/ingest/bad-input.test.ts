// Bad input to the upload endpoint: each case a clear 4xx with a reason, never a 5xx, no recording
// row, nothing new in the originals store, and no bytes left in the staging folder for a refusal.
import { readFile } from "node:fs/promises";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { organisations, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storageUse } from "@/lib/uploads/check-upload-quota";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { startUploadServer } from "@/tests/support/upload-server";
import { makePng, makeRawH264 } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, encodeMetadata, metadataFor, stagedDataSize, stagingFiles, storeFiles, tusRequest, uploadIdOf, type Target } from "./upload-helpers";

let actors: Record<DemoActorKey, Actor>;
let base: string;
let close: () => Promise<void>;
let target: Target;
let pilot: Record<string, string>;
let orgId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  const flight = await makeFlight(orgId);
  target = { jobId: flight.jobId, flightId: flight.id };
  pilot = await cookieOf(actors.pilot);
  ({ url: base, close } = await startUploadServer());
});
afterAll(async () => {
  await db().update(organisations).set({ storageQuotaBytes: null }).where(eq(organisations.id, orgId));
  await close();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

const rowCount = () => db().$count(recordings);

/** Runs `act`, then checks the common promises: a 4xx with a JSON reason, no row, store untouched. */
async function refused(act: () => Promise<Response>, status: number, reason: RegExp) {
  const rowsBefore = await rowCount();
  const storeBefore = await storeFiles();
  const res = await act();
  expect(res.status).toBe(status);
  const body = await res.json();
  expect(body.error.message).toMatch(reason);
  expect(await rowCount()).toBe(rowsBefore);
  expect(await storeFiles()).toEqual(storeBefore);
  return body;
}

const post = (headers: Record<string, string>) => tusRequest(base, "POST", "/api/uploads", { headers: { ...pilot, ...headers } });
const patch = (location: string, offset: number, body: Uint8Array) =>
  tusRequest(base, "PATCH", location, { headers: { ...pilot, "Upload-Offset": String(offset), "Content-Type": "application/offset+octet-stream" }, body });

async function created(size: number, filename: string): Promise<string> {
  const res = await post({ "Upload-Length": String(size), "Upload-Metadata": encodeMetadata(metadataFor(target, filename)) });
  expect(res.status).toBe(201);
  return res.headers.get("location")!;
}

describe("refused at creation", () => {
  const meta = (m: Record<string, string>) => encodeMetadata(m);
  const cases: [string, () => Record<string, string>, number, RegExp][] = [
    ["a zero-byte file", () => ({ "Upload-Length": "0", "Upload-Metadata": meta(metadataFor(target, "empty.264")) }), 422, /“empty\.264” was not stored: it is empty \(0 bytes\)/],
    ["path traversal in the file name", () => ({ "Upload-Length": "10", "Upload-Metadata": meta(metadataFor(target, "../../etc/passwd.264")) }), 422, /filename: the file name contains a path separator/],
    ["path traversal in the folder path", () => ({ "Upload-Length": "10", "Upload-Metadata": meta(metadataFor(target, "x.264", { relativePath: "/card/../../../x.264" })) }), 422, /relativePath: the folder path contains a “\.” or “\.\.” step/],
    ["a NUL in the file name", () => ({ "Upload-Length": "10", "Upload-Metadata": meta(metadataFor(target, "clip\u0000.264")) }), 422, /control characters/],
    ["a line break in the file name", () => ({ "Upload-Length": "10", "Upload-Metadata": meta(metadataFor(target, "clip\r\nX-Injected: 1.264")) }), 422, /control characters/],
    ["a direction override in the file name", () => ({ "Upload-Length": "10", "Upload-Metadata": meta(metadataFor(target, "clip\u202ekcp.264")) }), 422, /text-direction/],
    ["a length above the per-file limit", () => ({ "Upload-Length": String(20 * 1024 ** 3 + 1), "Upload-Metadata": meta(metadataFor(target, "huge.mp4")) }), 413, /larger than the 21\.5 GB limit/],
    ["no Upload-Length (deferred)", () => ({ "Upload-Defer-Length": "1", "Upload-Metadata": meta(metadataFor(target, "later.264")) }), 400, /send Upload-Length/],
    ["a length that is not a number", () => ({ "Upload-Length": "12abc", "Upload-Metadata": meta(metadataFor(target, "x.264")) }), 400, /upload-length/i],
    ["metadata with a value that is not Base64", () => ({ "Upload-Length": "10", "Upload-Metadata": "jobId !!!notbase64!!!" }), 400, /Upload-Metadata is malformed/],
    ["metadata with a key twice", () => ({ "Upload-Length": "10", "Upload-Metadata": "filename YS4yNjQ=,filename Yi4yNjQ=" }), 400, /Upload-Metadata is malformed/],
    ["metadata with a key containing a space", () => ({ "Upload-Length": "10", "Upload-Metadata": "file name YS4yNjQ=" }), 400, /Upload-Metadata is malformed/],
    ["metadata missing the flight", () => ({ "Upload-Length": "10", "Upload-Metadata": meta({ jobId: target.jobId, filename: "x.264" }) }), 422, /flightId: Required/],
    ["no metadata at all", () => ({ "Upload-Length": "10" }), 422, /metadata is not valid/],
    ["a flight id that is not an id", () => ({ "Upload-Length": "10", "Upload-Metadata": meta({ ...metadataFor(target, "x.264"), flightId: "' or 1=1 --" }) }), 422, /flightId/],
  ];
  it.each(cases)("%s: a 4xx with a reason, nothing staged", async (_label, headers, status, reason) => {
    const staged = await stagingFiles();
    await refused(() => post(headers()), status, reason);
    expect(await stagingFiles()).toEqual(staged);
  });
});

describe("refused by content, checked by bytes", () => {
  it("a text file named .264: 422 naming the file and the reason; staged bytes deleted", async () => {
    const text = Buffer.from("Flight log\nbattery 2: link faded behind the tower\n".repeat(20));
    const location = await created(text.length, "notes.264");
    const body = await refused(() => patch(location, 0, text), 422, /^“notes\.264” was not stored: it is text, not a recording\./);
    expect(body.error.code).toBe("unprocessable");
    expect(await stagedDataSize(uploadIdOf(location))).toBeNull();
    // asking again later gives the same refusal, not a fresh upload slot
    const head = await tusRequest(base, "HEAD", location, { headers: pilot });
    expect(head.status).toBe(422);
    const outcome = await (await tusRequest(base, "GET", location, { headers: pilot, tus: false })).json();
    expect(outcome).toMatchObject({ state: "refused", fileName: "notes.264" });
    expect(outcome.reason).toMatch(/it is text/);
  });

  it("a PNG named .mp4: 422, named as a PNG", async () => {
    const png = await readFile(await makePng());
    const location = await created(png.length, "inspection.mp4");
    await refused(() => patch(location, 0, png), 422, /“inspection\.mp4” was not stored: it is a PNG image, not a recording/);
    expect(await stagedDataSize(uploadIdOf(location))).toBeNull();
  });

  it("a large file that is not a recording is refused after its first chunk, not its last", async () => {
    const chunk = Buffer.alloc(1024 * 1024 + 7, "a log line that goes on and on\n");
    const location = await created(chunk.length * 4, "DUMP.264");
    const first = await patch(location, 0, chunk);
    expect(first.status).toBe(204); // the head is not complete until 1 MiB has arrived
    await refused(() => patch(location, chunk.length, chunk), 422, /“DUMP\.264” was not stored: it is text/);
    expect(await stagedDataSize(uploadIdOf(location))).toBeNull();
  });

  it("more bytes than the declared length: 413, the upload unchanged", async () => {
    const h264 = await readFile(await makeRawH264({ seconds: 1 }));
    const location = await created(1000, "short.264");
    await refused(() => patch(location, 0, h264.subarray(0, 2000)), 413, /More bytes were sent than the upload's declared Upload-Length/);
    expect(await stagedDataSize(uploadIdOf(location))).toBe(0);
  });
});

describe("the organisation's storage quota", () => {
  it("refuses an Upload-Length above what is free, counting uploads in progress in full", async () => {
    const use = await storageUse(orgId);
    const free = 10_000_000;
    await db().update(organisations).set({ storageQuotaBytes: use.storedBytes + use.reservedBytes + free }).where(eq(organisations.id, orgId));
    await refused(
      () => post({ "Upload-Length": String(free + 1), "Upload-Metadata": encodeMetadata(metadataFor(target, "big.mp4")) }),
      413,
      /“big\.mp4” \(10\.0 MB\) does not fit in the organisation's storage quota: 10\.0 MB of .* is free/,
    );
    // 6 MB in progress leaves 4 MB: a second 6 MB upload no longer fits
    await created(6_000_000, "first.mp4");
    await refused(() => post({ "Upload-Length": "6000000", "Upload-Metadata": encodeMetadata(metadataFor(target, "second.mp4")) }), 413, /4\.0 MB of .* is free/);
    await db().update(organisations).set({ storageQuotaBytes: null }).where(eq(organisations.id, orgId));
  });

  it("creations at the same moment cannot together pass it: room for two, four asked, two created", async () => {
    const use = await storageUse(orgId);
    await db().update(organisations).set({ storageQuotaBytes: use.storedBytes + use.reservedBytes + 10_000_000 }).where(eq(organisations.id, orgId));
    const stagedBefore = await stagingFiles();
    const answers = await Promise.all(
      ["a", "b", "c", "d"].map((n) => post({ "Upload-Length": "4000000", "Upload-Metadata": encodeMetadata(metadataFor(target, `parallel-${n}.mp4`)) })),
    );
    expect(answers.map((r) => r.status).sort()).toEqual([201, 201, 413, 413]);
    for (const r of answers.filter((a) => a.status === 413)) expect((await r.json()).error.message).toMatch(/2\.0 MB of .* is free/);
    // only the two created uploads are in the folder (an info file and a data file each)
    expect((await stagingFiles()).length).toBe(stagedBefore.length + 4);
    expect((await storageUse(orgId)).reservedBytes).toBe(use.reservedBytes + 8_000_000);
    await db().update(organisations).set({ storageQuotaBytes: null }).where(eq(organisations.id, orgId));
  });
});
