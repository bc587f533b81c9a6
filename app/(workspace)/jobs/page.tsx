import { Suspense } from "react";
import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { JobsView } from "@/components/work/jobs-view";

export const metadata = { title: "Jobs" };

export default async function JobsPage() {
  const member = await pageMember();
  return (
    <Suspense>
      <JobsView canWrite={can(member.role, "jobs.write")} me={{ userId: member.userId, role: member.role }} />
    </Suspense>
  );
}
