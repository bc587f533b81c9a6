import Link from "next/link";
import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { inScope } from "@/lib/auth/client-scope";
import { can } from "@/lib/auth/permissions";
import { loadJobHeading } from "@/lib/reports/load-job-heading";
import { PageHeader } from "@/components/ui/page-header";
import { JobReportsPanel } from "@/components/reports/job-reports-panel";
import { JobFindingsPanel } from "@/components/findings/job-findings-panel";

export const metadata = { title: "Report" };
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function JobReportPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember("findings.read");
  const { id } = await params;
  if (!UUID.test(id)) notFound();
  if (!(await inScope(member, "job", id.toLowerCase()))) notFound();
  const job = await loadJobHeading(member.organisationId, id.toLowerCase());
  if (!job) notFound();
  return (
    <div className="flex flex-col gap-6">
      <div>
        <Link href={`/jobs/${job.id}`} className="text-sm text-lake underline">
          ← {job.title}
        </Link>
        <PageHeader title={`Report: ${job.title}`} intro={`${job.clientName} · ${job.siteName}. The report compiles every live finding with its still, timecode, severity and the originals' hashes.`} />
      </div>
      <JobReportsPanel jobId={job.id} canBuild={can(member.role, "reports.build")} canApprove={can(member.role, "reports.approve")} />
      <JobFindingsPanel jobId={job.id} canWrite={can(member.role, "findings.write")} />
    </div>
  );
}
