// Custody exports: CSV for spreadsheets and JSON that carries every hashed field, so each event's
// hash can be recomputed outside Cairn.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as exportRoute from "@/app/api/custody/export/route";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { CSV_COLUMNS } from "@/lib/custody/export-custody-log";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";
import { makeSharedJob } from "../sharing/share-fixtures";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let job: Awaited<ReturnType<typeof makeSharedJob>>;

// Sorted-key JSON: for strings, integers, null, arrays and plain objects this is RFC 8785's form.
const sorted = (v: unknown): unknown =>
  Array.isArray(v) ? v.map(sorted) : v && typeof v === "object" ? Object.fromEntries(Object.keys(v).sort().map((k) => [k, sorted((v as Record<string, unknown>)[k])])) : v;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  await recordCustodyEvent({ organisationId: orgId, eventType: "upload", evidenceType: "recording", evidenceId: job.recA.id, jobId: job.jobId, originalSha256: job.recA.sha256, originalSize: job.recA.originalBytes.length, purpose: 'Upload, with "quotes", commas\nand a line break' });
  await recordCustodyEvent({ organisationId: orgId, eventType: "derived", evidenceType: "rendition", evidenceId: job.recA.id, jobId: job.jobId, tool: "ffmpeg", toolArgs: ["-f", "h264", "-r", "30", "-i", "in.264", "-c", "copy"], outputSha256: "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855" });
  await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "recording", evidenceId: job.recB.id, jobId: job.jobId });
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const get = async (who: DemoActorKey, query: string) => exportRoute.GET(await req(actors[who], "GET", `/api/custody/export?${query}`));

describe("custody export", () => {
  it("JSON: each event recomputes to its stored hash with Node's SHA-256; only the recording's events", async () => {
    const res = await get("owner", `format=json&recordingId=${job.recA.id}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="custody-recording-/);
    const body = await res.json();
    expect(body.hashRule).toContain("RFC 8785");
    expect(body.events.length).toBe(2);
    for (const e of body.events) {
      expect(e.evidenceId).toBe(job.recA.id);
      const { prevHash, hash, actorName: _n, ...payload } = e;
      const recomputed = createHash("sha256").update(`${prevHash}\n${JSON.stringify(sorted(payload))}`, "utf8").digest("hex");
      expect(recomputed).toBe(hash);
    }
    expect(body.events[0].purpose).toBe('Upload, with "quotes", commas\nand a line break');
    expect(body.events.map((e: { seq: number }) => e.seq)).toEqual([...body.events.map((e: { seq: number }) => e.seq)].sort((a, b) => a - b));
  });

  it("CSV: a header and one record per event, CRLF-terminated (RFC 4180)", async () => {
    const res = await get("reviewer", `format=csv&jobId=${job.jobId}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    const text = await res.text();
    expect(text.startsWith(CSV_COLUMNS.join(",") + "\r\n")).toBe(true);
    const jobEvents = await db().$count(s.custodyEvents, eq(s.custodyEvents.jobId, job.jobId));
    // records end in CRLF; the only bare LF is inside the quoted purpose
    expect(text.split("\r\n").filter(Boolean)).toHaveLength(jobEvents + 1);
    expect(text).toContain('"Upload, with ""quotes"", commas\nand a line break"');
    expect(text).toContain('"[""-f"",""h264"",""-r"",""30"",""-i"",""in.264"",""-c"",""copy""]"');
  });

  it("is refused to clients and other organisations", async () => {
    expect((await get("client", "format=csv")).status).toBe(403);
    expect((await get("other", `format=csv&jobId=${job.jobId}`)).status).toBe(404);
    expect((await get("anonymous", "format=csv")).status).toBe(401);
    expect((await get("owner", "format=xml")).status).toBe(422);
  });
});
