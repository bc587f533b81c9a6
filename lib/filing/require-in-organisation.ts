// Ids that a body refers to (clientId, siteId, jobId, pilotId, reviewerId) must name rows of the
// caller's own organisation. Another organisation's id answers exactly like an unknown one, as a
// field error (422), so a request can never learn that the row exists elsewhere.
import "server-only";
import { and, eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { clients, jobs, memberships, sites } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import { ApiError } from "@/lib/api/errors";

const refused = (field: string, message: string) => new ApiError("unprocessable", message, { [field]: [message] });

export async function requireClientIn(tx: DbOrTx, orgId: string, clientId: string, field = "clientId") {
  const [row] = await tx.select({ id: clients.id }).from(clients).where(and(eq(clients.id, clientId), eq(clients.organisationId, orgId)));
  if (!row) throw refused(field, "No such client in this organisation");
  return row;
}

export async function requireSiteIn(tx: DbOrTx, orgId: string, siteId: string, field = "siteId") {
  const [row] = await tx.select({ id: sites.id }).from(sites).where(and(eq(sites.id, siteId), eq(sites.organisationId, orgId)));
  if (!row) throw refused(field, "No such site in this organisation");
  return row;
}

export async function requireJobIn(tx: DbOrTx, orgId: string, jobId: string, field = "jobId") {
  const [row] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.organisationId, orgId)));
  if (!row) throw refused(field, "No such job in this organisation");
  return row;
}

/** Which roles may fill a crew seat. Owners of small crews fly and review themselves. */
export const CREW_ROLES = {
  pilot: ["pilot", "owner"],
  reviewer: ["reviewer", "owner"],
} as const satisfies Record<string, readonly Role[]>;

export async function requireCrewIn(tx: DbOrTx, orgId: string, userId: string, seat: keyof typeof CREW_ROLES, field: string) {
  const [row] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.organisationId, orgId)));
  if (!row) throw refused(field, "Not a member of this organisation");
  const allowed: readonly Role[] = CREW_ROLES[seat];
  if (!allowed.includes(row.role)) throw refused(field, `The ${seat} must be a member with the role ${allowed.join(" or ")}`);
}
