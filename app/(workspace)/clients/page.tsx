import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { ClientsView } from "@/components/work/clients-view";

export const metadata = { title: "Clients" };

export default async function ClientsPage() {
  const member = await pageMember();
  return <ClientsView canWrite={can(member.role, "clients.write")} />;
}
