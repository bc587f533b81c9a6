// Test factories with sensible defaults: each returns the inserted row.
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import * as s from "@/db/schema";

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
