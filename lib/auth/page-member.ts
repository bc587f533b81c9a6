import "server-only";
// For server-rendered workspace pages: the signed-in member, or a redirect to sign-in.
import { getServerSession } from "next-auth";
import { redirect, notFound } from "next/navigation";
import { authOptions } from "./auth-options";
import { loadMember, type Member } from "./load-member";
import { can, type Permission } from "./permissions";

export async function pageMember(permission: Permission = "workspace.read"): Promise<Member> {
  const session = await getServerSession(authOptions);
  const user = session?.user as { id?: string; organisationId?: string | null } | undefined;
  if (!user?.id) redirect("/sign-in");
  const member = await loadMember({ userId: user.id, organisationId: user.organisationId ?? null });
  if (!member) redirect("/sign-in?error=membership");
  // pages answer "not found" rather than revealing a page the role may not use
  if (!can(member.role, permission)) notFound();
  return member;
}
