// What the range pages draw before any client-side fetch: the organisation's sites with coordinates
// (for the calculator's plan) and its flights (to file range checks under). Read here, inside the
// organisation, until the sites and flights APIs serve the same lists.
import "server-only";
import { and, asc, desc, eq, isNotNull, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, sites } from "@/db/schema";

export type PlanSite = { id: string; name: string; address: string | null; latitude: number; longitude: number; launchNotes: string | null };

export async function loadPlanSites(orgId: string): Promise<PlanSite[]> {
  const rows = await db()
    .select({ id: sites.id, name: sites.name, address: sites.address, latitude: sites.latitude, longitude: sites.longitude, launchNotes: sites.launchNotes })
    .from(sites)
    .where(and(eq(sites.organisationId, orgId), isNull(sites.archivedAt), isNotNull(sites.latitude), isNotNull(sites.longitude)))
    .orderBy(asc(sites.name));
  return rows.map((r) => ({ ...r, latitude: r.latitude!, longitude: r.longitude! }));
}

export type RangeFlight = {
  id: string;
  flownOn: string;
  jobTitle: string;
  siteName: string;
  siteId: string;
  aircraft: string | null;
  maxAltitudeAglM: number | null;
  launchLatitude: number | null;
  launchLongitude: number | null;
};

export async function loadRangeFlights(orgId: string): Promise<RangeFlight[]> {
  return db()
    .select({
      id: flights.id,
      flownOn: flights.flownOn,
      jobTitle: jobs.title,
      siteName: sites.name,
      siteId: sites.id,
      aircraft: flights.aircraft,
      maxAltitudeAglM: flights.maxAltitudeAglM,
      launchLatitude: flights.launchLatitude,
      launchLongitude: flights.launchLongitude,
    })
    .from(flights)
    .innerJoin(jobs, and(eq(jobs.id, flights.jobId), eq(jobs.organisationId, orgId)))
    .innerJoin(sites, and(eq(sites.id, jobs.siteId), eq(sites.organisationId, orgId)))
    .where(and(eq(flights.organisationId, orgId), isNull(flights.archivedAt)))
    .orderBy(desc(flights.flownOn), asc(jobs.title), asc(flights.createdAt));
}
