// Seeds the invented demo scenario. Idempotent: when the demo organisation exists, nothing changes.
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { DEFAULT_CATEGORIES } from "@/lib/findings/default-categories";
import { demoRangeChecks } from "@/lib/range-checks/demo-range-checks";
import { DEMO_CLIENT_ACCOUNT_CLIENTS, DEMO_CLIENTS, DEMO_FLIGHTS, DEMO_JOBS, DEMO_ORG, DEMO_PASSWORD, DEMO_SITES, DEMO_USERS, OTHER_ORG, OTHER_USER } from "./demo-scenario";

const day = 24 * 3600 * 1000;
const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * day).toISOString().slice(0, 10);

export async function seedDemo(database: Db): Promise<{ created: boolean; organisationId: string }> {
  const [existing] = await database.select({ id: s.organisations.id }).from(s.organisations).where(eq(s.organisations.slug, DEMO_ORG.slug));
  if (existing) return { created: false, organisationId: existing.id };
  const passwordHash = await hashPassword(DEMO_PASSWORD);

  const organisationId = await database.transaction(async (tx) => {
    const [org] = await tx.insert(s.organisations).values(DEMO_ORG).returning();
    const userIds: Record<string, string> = {};
    const membershipIds: Record<string, string> = {};
    for (const u of DEMO_USERS) {
      const [row] = await tx.insert(s.users).values({ email: u.email, name: u.name, passwordHash, emailVerifiedAt: new Date() }).returning();
      userIds[u.key] = row.id;
      const [m] = await tx.insert(s.memberships).values({ organisationId: org.id, userId: row.id, role: u.role }).returning({ id: s.memberships.id });
      membershipIds[u.key] = m.id;
    }
    const clientIds: Record<string, string> = {};
    for (const c of DEMO_CLIENTS) {
      const { key, ...values } = c;
      const [row] = await tx.insert(s.clients).values({ ...values, organisationId: org.id }).returning();
      clientIds[key] = row.id;
    }
    await tx
      .insert(s.membershipClients)
      .values(DEMO_CLIENT_ACCOUNT_CLIENTS.map((c) => ({ membershipId: membershipIds.client, clientId: clientIds[c], organisationId: org.id })));
    const siteIds: Record<string, string> = {};
    for (const site of DEMO_SITES) {
      const { key, client, ...values } = site;
      const [row] = await tx.insert(s.sites).values({ ...values, clientId: clientIds[client], organisationId: org.id, timeZone: DEMO_ORG.timeZone }).returning();
      siteIds[key] = row.id;
    }
    const jobIds: Record<string, string> = {};
    for (const j of DEMO_JOBS) {
      const [row] = await tx
        .insert(s.jobs)
        .values({
          organisationId: org.id,
          siteId: siteIds[j.site],
          title: j.title,
          scope: j.scope,
          status: j.status,
          dueDate: isoDay(j.dueInDays),
          pilotId: userIds.pilot,
          reviewerId: userIds.reviewer,
        })
        .returning();
      jobIds[j.key] = row.id;
    }
    const flightIds: Record<string, string> = {};
    for (const f of DEMO_FLIGHTS) {
      const [flight] = await tx.insert(s.flights).values({
        organisationId: org.id,
        jobId: jobIds[f.job],
        flownOn: isoDay(-f.daysAgo),
        pilotId: userIds.pilot,
        aircraft: f.aircraft,
        maxAltitudeAglM: f.maxAltitudeAglM,
        launchLatitude: f.launch[0],
        launchLongitude: f.launch[1],
        notes: f.notes || null,
      }).returning();
      flightIds[f.key] = flight.id;
    }
    await tx.insert(s.rangeChecks).values(demoRangeChecks(org.id, flightIds, userIds.pilot));
    await tx.insert(s.findingCategories).values(DEFAULT_CATEGORIES.map((c) => ({ ...c, organisationId: org.id })));

    const [other] = await tx.insert(s.organisations).values(OTHER_ORG).returning();
    const [otherUser] = await tx.insert(s.users).values({ email: OTHER_USER.email, name: OTHER_USER.name, passwordHash, emailVerifiedAt: new Date() }).returning();
    await tx.insert(s.memberships).values({ organisationId: other.id, userId: otherUser.id, role: OTHER_USER.role });
    return org.id;
  });
  return { created: true, organisationId };
}
