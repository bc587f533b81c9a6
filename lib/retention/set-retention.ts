// Sets a retention period in days: the organisation's default, or a client's or a job's own (null
// clears an override, so the next one applies). Only what the owner's organisation holds.
import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, jobs, organisations } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import type { RetentionInput } from "@/lib/validation/retention";

export async function setRetention(organisationId: string, input: RetentionInput) {
  const days = input.days;
  const now = new Date();
  if (input.target === "organisation") {
    await db().update(organisations).set({ retentionDays: days, updatedAt: now }).where(eq(organisations.id, organisationId));
    return { target: input.target, id: organisationId, days };
  }
  const table = input.target === "client" ? clients : jobs;
  const [row] = await db()
    .update(table)
    .set({ retentionDays: days, updatedAt: now })
    .where(and(eq(table.id, input.id), eq(table.organisationId, organisationId)))
    .returning({ id: table.id });
  if (!row) throw notFound(input.target === "client" ? "Client not found" : "Job not found");
  return { target: input.target, id: row.id, days };
}

export async function readRetentionDefaults(organisationId: string) {
  const [o] = await db().select({ days: organisations.retentionDays }).from(organisations).where(eq(organisations.id, organisationId));
  return { organisationDays: o?.days ?? null };
}

/** The organisation's clients with their own periods, for the disposal page's override form. */
export async function listClientRetention(organisationId: string) {
  return db()
    .select({ id: clients.id, name: clients.name, retentionDays: clients.retentionDays })
    .from(clients)
    .where(and(eq(clients.organisationId, organisationId), isNull(clients.archivedAt)))
    .orderBy(asc(clients.name))
    .limit(1000);
}
