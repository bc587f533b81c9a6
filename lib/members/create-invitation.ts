// Invites a person by e-mail into the organisation with a role. A newer invitation to the same address
// replaces any pending one, so only the latest link works.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { invitations, memberships, users } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { env } from "@/lib/config/env";
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import type { InviteInput } from "@/lib/validation/members";
import { INVITATION_LIFETIME_MS, hashInvitationToken, newInvitationToken } from "./invitation-token";
import { clientsOfOrganisation } from "./member-clients";

export function invitationUrl(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/invite/${token}`;
}

export async function createInvitation(inviter: Pick<Member, "organisationId" | "organisationName" | "userId" | "name">, input: InviteInput) {
  const orgId = inviter.organisationId;
  const token = newInvitationToken();
  const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_MS);
  return db().transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: memberships.id })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.organisationId, orgId), eq(users.email, input.email)));
    if (existing) throw new ApiError("conflict", "This person is already a member; change their role instead.", { email: ["Already a member of this organisation"] });
    // a client account is tied to the clients whose work it will see; the crew never is
    const clientIds = input.role === "client" ? await clientsOfOrganisation(tx, orgId, input.clientIds ?? []) : [];
    await tx
      .update(invitations)
      .set({ revoked: true, updatedAt: new Date() })
      .where(and(eq(invitations.organisationId, orgId), eq(invitations.email, input.email), isNull(invitations.acceptedAt), eq(invitations.revoked, false)));
    const [row] = await tx
      .insert(invitations)
      .values({ organisationId: orgId, email: input.email, role: input.role, clientIds, tokenHash: hashInvitationToken(token), invitedBy: inviter.userId, expiresAt })
      .returning({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt });
    const role = ROLE_LABELS[input.role];
    const body = composeMail(
      [
        `${inviter.name} invited you to join ${inviter.organisationName} on Cairn as ${role.label.toLowerCase()}.`,
        `${role.label}: ${role.meaning}`,
        `The link works once and expires on ${expiresAt.toISOString().slice(0, 10)} (7 days). If you did not expect this, ignore this message.`,
      ],
      { label: "Accept the invitation", url: invitationUrl(token) },
    );
    // sent inside the transaction: if the mail cannot be handed over, no invitation is left behind
    await sendMail({ to: input.email, subject: `Invitation to ${inviter.organisationName} on Cairn`, ...body });
    return row;
  });
}
