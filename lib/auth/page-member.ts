import "server-only";
// For server-rendered workspace pages: the signed-in member, or a redirect to sign-in.
import { getServerSession } from "next-auth";
import { redirect, notFound } from "next/navigation";
import { cache } from "react";
import { authOptions } from "./auth-options";
import { loadMember, type Member } from "./load-member";
import { can, type Permission } from "./permissions";
import { isSessionOpen } from "./user-sessions";

// Once per server request (React's cache): the layout, the page and its metadata each ask, and
// should not each decode the session and query the membership again.
const currentMember = cache(async (): Promise<Member | "no-session" | "no-membership"> => {
  const session = await getServerSession(authOptions);
  const user = session?.user as { id?: string; organisationId?: string | null; sessionId?: string } | undefined;
  if (!user?.id || !user.sessionId) return "no-session";
  const member = await loadMember({ userId: user.id, organisationId: user.organisationId ?? null, sessionId: user.sessionId });
  if (member) return member;
  // a session ended on the server (sign-out elsewhere, password or role change) is simply signed out
  return (await isSessionOpen(user.sessionId)) ? "no-membership" : "no-session";
});

export async function pageMember(permission: Permission = "workspace.read"): Promise<Member> {
  const member = await currentMember();
  if (member === "no-session") redirect("/sign-in");
  if (member === "no-membership") redirect("/sign-in?error=membership");
  // pages answer "not found" rather than revealing a page the role may not use
  if (!can(member.role, permission)) notFound();
  return member;
}
