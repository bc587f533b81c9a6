import { Suspense } from "react";
import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { SitesView } from "@/components/work/sites-view";

export const metadata = { title: "Sites" };

export default async function SitesPage() {
  const member = await pageMember();
  return (
    <Suspense>
      <SitesView canWrite={can(member.role, "sites.write")} />
    </Suspense>
  );
}
