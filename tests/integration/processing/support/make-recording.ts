// A recording as ingest leaves it: the original placed write-once in the store (a copy of the given
// file, since placing moves it), its SHA-256, and a row in state "waiting".
import { randomUUID } from "node:crypto";
import { copyFile, mkdir } from "node:fs/promises";
import { createReadStream } from "node:fs";
import os from "node:os";
import path from "node:path";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import type { NewRecording } from "@/db/schema/types";
import { placeOriginal } from "@/lib/storage/local-store";
import { originalKey } from "@/lib/storage/storage-keys";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { makeFlight } from "@/tests/support/factories";

export async function makeRecording(
  organisationId: string,
  file: string,
  over: Partial<NewRecording> & { flightId?: string; jobId?: string } = {},
) {
  let { flightId, jobId } = over;
  if (!flightId || !jobId) {
    const flight = await makeFlight(organisationId);
    flightId = flight.id;
    jobId = flight.jobId;
  }
  const id = randomUUID();
  const staging = path.join(os.tmpdir(), "cairn-test-staging-3");
  await mkdir(staging, { recursive: true });
  const copy = path.join(staging, id);
  await copyFile(file, copy);
  const digest = await sha256OfStream(createReadStream(copy));
  const key = originalKey(organisationId, id);
  await placeOriginal(copy, key);
  const [row] = await db()
    .insert(recordings)
    .values({
      id,
      organisationId,
      jobId,
      flightId,
      originalName: path.basename(file),
      sizeBytes: digest.bytes,
      kind: "raw_h264",
      sha256: digest.hex,
      storageKey: key,
      state: "waiting",
      ...over,
    })
    .returning();
  return row;
}
