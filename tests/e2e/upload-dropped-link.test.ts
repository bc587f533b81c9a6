// The production web process (`next start`, started by the e2e setup) when the link drops in the
// middle of a PATCH: the bytes that arrived are kept, and tus-js-client (an independent tus 1.0.0
// client) resumes from the server's offset and completes byte-exact. Hashes are checked with GNU
// coreutils' sha256sum. The same case against the stand-alone server around the route module is in
// tests/integration/ingest/tus-endpoint.test.ts; this one covers Next's own request-body handling.
import { readFile } from "node:fs/promises";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { DEMO_USERS } from "@/db/seed/demo-scenario";
import { E2E_PORT } from "@/tests/support/test-env";
import { actorByEmail } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makePaddedRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, dropMidPatch, encodeMetadata, metadataFor, stagedDataSize, stagedPrefix, tusRequest, tusUpload, uploadIdOf } from "@/tests/integration/ingest/upload-helpers";

const base = `http://127.0.0.1:${E2E_PORT}`;
const pilotEmail = DEMO_USERS.find((u) => u.role === "pilot")!.email;

afterAll(async () => {
  await closeDb();
});

describe("a dropped link against next start", () => {
  it("keeps the bytes of a PATCH cut off mid-way; the upload resumes from them and is stored byte-exact", async () => {
    const pilot = await actorByEmail(pilotEmail);
    const headers = await cookieOf(pilot);
    const flight = await makeFlight(pilot.organisationId, { aircraft: "E2E dropped link" });
    const target = { jobId: flight.jobId, flightId: flight.id };
    const size = 12 * 1024 * 1024;
    const file = await makePaddedRawH264(size, "e2e-drop-mid-patch");
    const reference = await sha256sum(file);
    const source = await readFile(file);

    const createdRes = await tusRequest(base, "POST", "/api/uploads", { headers: { ...headers, "Upload-Length": String(size), "Upload-Metadata": encodeMetadata(metadataFor(target, "REC_0042.264")) } });
    expect(createdRes.status, await createdRes.clone().text()).toBe(201);
    const location = new URL(createdRes.headers.get("location")!, base).pathname;
    const uploadId = uploadIdOf(location);

    const sent = 6 * 1024 * 1024;
    const offset = await dropMidPatch({ base, location, source, announced: size, sent, headers });
    expect(offset).toBeGreaterThanOrEqual(sent - 2 * 1024 * 1024);
    expect(offset).toBeLessThanOrEqual(sent);
    expect(await stagedDataSize(uploadId)).toBe(offset);
    expect(Buffer.compare(await stagedPrefix(uploadId, offset), source.subarray(0, offset))).toBe(0);

    const resumed = await tusUpload({ endpoint: base, source: file, metadata: metadataFor(target, "REC_0042.264"), headers, uploadUrl: `${base}${location}` });
    expect(Math.min(...resumed.progress)).toBeGreaterThanOrEqual(offset);
    expect(resumed.headers["Cairn-Upload-Outcome"]).toBe("stored");
    expect(resumed.headers["Cairn-Original-SHA256"]).toBe(reference);
  });
});
