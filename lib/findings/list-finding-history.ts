// Every version of a finding, oldest first, with who made it: the answer to "what did this say before?"
import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { findingRevisions, findings, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";

export async function listFindingHistory(organisationId: string, findingId: string) {
  const [exists] = await db()
    .select({ id: findings.id })
    .from(findings)
    .where(and(eq(findings.id, findingId), eq(findings.organisationId, organisationId)));
  if (!exists) throw notFound("Finding not found");
  const items = await db()
    .select({
      version: findingRevisions.version,
      action: findingRevisions.action,
      snapshot: findingRevisions.snapshot,
      editedById: findingRevisions.editedBy,
      editedByName: users.name,
      createdAt: findingRevisions.createdAt,
    })
    .from(findingRevisions)
    .leftJoin(users, eq(users.id, findingRevisions.editedBy))
    .where(and(eq(findingRevisions.findingId, findingId), eq(findingRevisions.organisationId, organisationId)))
    .orderBy(asc(findingRevisions.version));
  return { items, total: items.length };
}
