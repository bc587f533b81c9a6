import { pageMember } from "@/lib/auth/page-member";
import { WorkspaceShell } from "@/components/shell/workspace-shell";

export const dynamic = "force-dynamic";

export default async function WorkspaceLayout({ children }: { children: React.ReactNode }) {
  const member = await pageMember();
  return (
    <WorkspaceShell organisationName={member.organisationName} userName={member.name} userEmail={member.email} role={member.role}>
      {children}
    </WorkspaceShell>
  );
}
