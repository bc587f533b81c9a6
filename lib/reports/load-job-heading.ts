// The job a report page is about, inside the member's organisation (null: not found there).
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, jobs, sites } from "@/db/schema";

export async function loadJobHeading(organisationId: string, jobId: string) {
  const [row] = await db()
    .select({ id: jobs.id, title: jobs.title, siteName: sites.name, clientName: clients.name, status: jobs.status })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  return row ?? null;
}
