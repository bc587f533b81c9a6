import "server-only";
// For server-rendered workspace pages: the signed-in member, or a redirect to sign-in.
import { getServerSession } from "next-auth";
import { redirect, notFound } from "next/navigation";
import { cache } from "react";
import { authOptions } from "./auth-options";
import { loadMember, type Member } from "./load-member";
import { can, type Permission } from "./permissions";

// Once per server request (React's cache): the layout, the page and its metadata each ask, and
// should not each decode the session and query the membership again.
const currentMember = cache(async (): Promise<Member | "no-session" | "no-membership"> => {
  const session = await getServerSession(authOptions);
  const user = session?.user as { id?: string; organisationId?: string | null } | undefined;
  if (!user?.id) return "no-session";
  return (await loadMember({ userId: user.id, organisationId: user.organisationId ?? null })) ?? "no-membership";
});

export async function pageMember(permission: Permission = "workspace.read"): Promise<Member> {
  const member = await currentMember();
  if (member === "no-session") redirect("/sign-in");
  if (member === "no-membership") redirect("/sign-in?error=membership");
  // pages answer "not found" rather than revealing a page the role may not use
  if (!can(member.role, permission)) notFound();
  return member;
}
