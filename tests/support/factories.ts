// Test factories with sensible defaults, in one place: each inserts what a test needs and returns the
// row. Scenario fixtures built from these live beside their tests (tests/integration/sharing/
// share-fixtures.ts); a recording processed by the real worker handler is
// tests/support/media/make-processed-recording.ts.
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { copyFile, mkdir } from "node:fs/promises";
import { createReadStream } from "node:fs";
import os from "node:os";
import path from "node:path";
import type { NewRecording, Role } from "@/db/schema/types";
import { placeOriginal } from "@/lib/storage/store";
import { originalKey } from "@/lib/storage/storage-keys";
import { sha256OfStream } from "@/lib/custody/sha256-stream";

const uniq = () => randomUUID().slice(0, 8);

export async function makeClient(organisationId: string, over: Partial<typeof s.clients.$inferInsert> = {}) {
  const [row] = await db().insert(s.clients).values({ organisationId, name: `Test client ${uniq()}`, ...over }).returning();
  return row;
}

export async function makeSite(organisationId: string, over: Partial<typeof s.sites.$inferInsert> = {}) {
  const clientId = over.clientId ?? (await makeClient(organisationId)).id;
  const [row] = await db()
    .insert(s.sites)
    .values({ organisationId, clientId, name: `Test site ${uniq()}`, latitude: 54.4, longitude: -2.6, ...over })
    .returning();
  return row;
}

export async function makeJob(organisationId: string, over: Partial<typeof s.jobs.$inferInsert> = {}) {
  const siteId = over.siteId ?? (await makeSite(organisationId)).id;
  const [row] = await db().insert(s.jobs).values({ organisationId, siteId, title: `Test job ${uniq()}`, ...over }).returning();
  return row;
}

export async function makeFlight(organisationId: string, over: Partial<typeof s.flights.$inferInsert> = {}) {
  const jobId = over.jobId ?? (await makeJob(organisationId)).id;
  const [row] = await db()
    .insert(s.flights)
    .values({ organisationId, jobId, flownOn: "2026-03-14", aircraft: "Test airframe", launchLatitude: 54.41, launchLongitude: -2.62, ...over })
    .returning();
  return row;
}

/** A recording row only (no stored original): for lists, pages and states that need no media. */
export async function makeRecording(organisationId: string, flight: { id: string; jobId: string }, over: Partial<typeof s.recordings.$inferInsert> = {}) {
  const [row] = await db()
    .insert(s.recordings)
    .values({
      organisationId,
      jobId: flight.jobId,
      flightId: flight.id,
      originalName: `TEST${uniq()}.264`,
      sizeBytes: 1024,
      kind: "raw_h264",
      sha256: "0".repeat(64),
      state: "waiting",
      ...over,
    })
    .returning();
  return row;
}

/** A throw-away member of an organisation, for tests that change roles or remove people. */
export async function makeMember(organisationId: string, role: Role, over: { email?: string; name?: string; passwordHash?: string | null } = {}) {
  const tag = randomUUID().slice(0, 8);
  const [user] = await db()
    .insert(s.users)
    .values({ email: over.email ?? `${role}-${tag}@test.example`, name: over.name ?? `Test ${role} ${tag}`, passwordHash: over.passwordHash ?? null })
    .returning();
  await db().insert(s.memberships).values({ organisationId, userId: user.id, role });
  return { userId: user.id, organisationId, email: user.email, name: user.name };
}

/** A recording as an upload leaves it: the original placed write-once in the store (a copy of the
 * given file, since placing moves it), its SHA-256, and a row in state "waiting". */
export async function makeRecordingWithOriginal(
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
    .insert(s.recordings)
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
