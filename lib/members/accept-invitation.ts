// Accepts an invitation: a new person gets an account with the name and password they chose; someone
// who already has an account joins the organisation. Either way the invitation is used up, in one transaction.
import "server-only";
import { and, eq, isNull, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { invitations, memberships, organisations, users } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { hashPassword } from "@/lib/auth/password";
import type { AcceptInviteInput } from "@/lib/validation/members";
import { hashInvitationToken } from "./invitation-token";
import { invitationState } from "./invitations";
import { tieInvitedClients } from "./member-clients";

export async function acceptInvitation(input: AcceptInviteInput) {
  const tokenHash = hashInvitationToken(input.token);
  return db().transaction(async (tx) => {
    const [inv] = await tx
      .select({
        id: invitations.id,
        organisationId: invitations.organisationId,
        email: invitations.email,
        role: invitations.role,
        clientIds: invitations.clientIds,
        expiresAt: invitations.expiresAt,
        acceptedAt: invitations.acceptedAt,
        revoked: invitations.revoked,
      })
      .from(invitations)
      .where(eq(invitations.tokenHash, tokenHash))
      .for("update");
    if (!inv) throw new ApiError("not_found", "This invitation link is not valid.");
    const state = invitationState(inv);
    if (state !== "pending") {
      const why = { accepted: "was already used", revoked: "was withdrawn", expired: "has expired" }[state];
      throw new ApiError("gone", `This invitation ${why}. Ask an owner of the organisation for a new one.`);
    }

    let [user] = await tx.select({ id: users.id }).from(users).where(eq(users.email, inv.email));
    const newAccount = !user;
    if (!user) {
      const fields: Record<string, string[]> = {};
      if (!input.name) fields.name = ["Required"];
      if (!input.password) fields.password = ["Required"];
      if (Object.keys(fields).length) throw new ApiError("unprocessable", "Choose your name and a password", fields);
      const passwordHash = await hashPassword(input.password!);
      // the mailed link proves the address, so it counts as verified
      [user] = await tx
        .insert(users)
        .values({ email: inv.email, name: input.name!, passwordHash, emailVerifiedAt: new Date() })
        .onConflictDoNothing({ target: users.email })
        .returning({ id: users.id });
      if (!user) throw new ApiError("conflict", "An account with this address was created meanwhile; open the link again.");
    }
    const [membership] = await tx
      .insert(memberships)
      .values({ organisationId: inv.organisationId, userId: user.id, role: inv.role })
      .onConflictDoNothing()
      .returning({ id: memberships.id });
    if (membership && inv.role === "client") await tieInvitedClients(tx, inv.organisationId, membership.id, inv.clientIds);
    await tx.update(invitations).set({ acceptedAt: new Date(), updatedAt: new Date() }).where(eq(invitations.id, inv.id));
    // any other open invitation to the same address is now pointless
    await tx
      .update(invitations)
      .set({ revoked: true, updatedAt: new Date() })
      .where(and(eq(invitations.organisationId, inv.organisationId), eq(invitations.email, inv.email), isNull(invitations.acceptedAt), ne(invitations.id, inv.id)));
    const [org] = await tx.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, inv.organisationId));
    return { email: inv.email, organisationName: org.name, role: inv.role, newAccount };
  });
}
