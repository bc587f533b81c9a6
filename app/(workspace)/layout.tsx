import { pageMember } from "@/lib/auth/page-member";
import { organisationsOfUser } from "@/lib/auth/organisations-of-user";
import { WorkspaceShell } from "@/components/shell/workspace-shell";

export const dynamic = "force-dynamic";

export default async function WorkspaceLayout({ children }: { children: React.ReactNode }) {
  const member = await pageMember();
  const organisations = await organisationsOfUser(member.userId);
  return (
    <WorkspaceShell
      organisationId={member.organisationId}
      organisationName={member.organisationName}
      organisations={organisations}
      userName={member.name}
      userEmail={member.email}
      role={member.role}
    >
      {children}
    </WorkspaceShell>
  );
}
