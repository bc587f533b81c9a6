// Revokes a link: from the next request on, the page answers 410 and every signed media address
// under it is refused (the media route re-reads the link each time). Revoking twice changes nothing
// and records nothing the second time.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { shareLinks } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import type { AccessFacts } from "./record-share-access";

export async function revokeShareLink(member: Member, linkId: string, facts: AccessFacts): Promise<{ id: string; revokedAt: Date }> {
  return db().transaction(async (tx) => {
    const [row] = await tx
      .update(shareLinks)
      .set({ revokedAt: new Date(), revokedBy: member.userId, updatedAt: new Date() })
      .where(and(eq(shareLinks.id, linkId), eq(shareLinks.organisationId, member.organisationId), isNull(shareLinks.revokedAt)))
      .returning({ id: shareLinks.id, revokedAt: shareLinks.revokedAt, jobId: shareLinks.jobId, label: shareLinks.label });
    if (!row) {
      const [existing] = await tx
        .select({ id: shareLinks.id, revokedAt: shareLinks.revokedAt })
        .from(shareLinks)
        .where(and(eq(shareLinks.id, linkId), eq(shareLinks.organisationId, member.organisationId)));
      if (!existing?.revokedAt) throw notFound("Share link not found");
      return { id: existing.id, revokedAt: existing.revokedAt };
    }
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: "revoke",
        evidenceType: "share_link",
        evidenceId: row.id,
        jobId: row.jobId,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        purpose: `Share link revoked: ${row.label}`,
      },
      tx,
    );
    return { id: row.id, revokedAt: row.revokedAt! };
  });
}
