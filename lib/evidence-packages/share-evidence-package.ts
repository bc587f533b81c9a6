// Lets a share link carry an evidence package of its job (or takes it off again): whoever holds the link
// may then download that package from the share page (/api/s/:token/package). Only a link of the same
// job, not revoked, can carry it; attaching is recorded in the custody chain like any sharing.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages, shareLinks } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";

export async function setPackageShare(member: Pick<Member, "organisationId" | "userId" | "role">, packageId: string, shareLinkId: string | null, facts: RequestFacts) {
  return db().transaction(async (tx) => {
    const [pkg] = await tx
      .select({ id: evidencePackages.id, jobId: evidencePackages.jobId, state: evidencePackages.state, sha256: evidencePackages.sha256 })
      .from(evidencePackages)
      .where(and(eq(evidencePackages.id, packageId), eq(evidencePackages.organisationId, member.organisationId)));
    if (!pkg) throw notFound("Evidence package not found");
    if (shareLinkId === null) {
      const cleared = await tx
        .update(shareLinks)
        .set({ evidencePackageId: null, updatedAt: new Date() })
        .where(and(eq(shareLinks.organisationId, member.organisationId), eq(shareLinks.evidencePackageId, pkg.id)))
        .returning({ id: shareLinks.id });
      return { packageId: pkg.id, shareLinkIds: [] as string[], removedFrom: cleared.map((c) => c.id) };
    }
    if (pkg.state !== "ready") throw new ApiError("conflict", "Only a built package can be shared.");
    const [link] = await tx
      .select({ id: shareLinks.id, jobId: shareLinks.jobId })
      .from(shareLinks)
      .where(and(eq(shareLinks.id, shareLinkId), eq(shareLinks.organisationId, member.organisationId), isNull(shareLinks.revokedAt)))
      .for("update");
    if (!link) throw notFound("Share link not found");
    if (link.jobId !== pkg.jobId) throw new ApiError("unprocessable", "The share link is for another job", { shareLinkId: ["Choose a share link of this package's job"] });
    await tx.update(shareLinks).set({ evidencePackageId: pkg.id, updatedAt: new Date() }).where(eq(shareLinks.id, link.id));
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: "share",
        evidenceType: "evidence_package",
        evidenceId: pkg.id,
        jobId: pkg.jobId,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        outputSha256: pkg.sha256,
        purpose: "Evidence package added to a share link",
        details: { shareLinkId: link.id },
      },
      tx,
    );
    return { packageId: pkg.id, shareLinkIds: [link.id], removedFrom: [] as string[] };
  });
}
