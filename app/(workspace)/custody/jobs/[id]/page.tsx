// /custody/jobs/:id: a job's evidence handling: legal hold, share links with opens and downloads,
// and the job's custody trail with the verify action.
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { loadCustodyJob } from "@/lib/custody/load-custody-subject";
import { PageHeader } from "@/components/ui/page-header";
import { DetailSection } from "@/components/work/detail-section";
import { LegalHoldControl } from "@/components/custody/legal-hold-control";
import { JobShareLinksPanel } from "@/components/sharing/job-share-links-panel";
import { CustodyLogPanel } from "@/components/custody/custody-log-panel";

export const metadata = { title: "Job custody and sharing" };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function JobCustodyPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember("custody.read");
  const { id } = await params;
  const job = UUID.test(id) ? await loadCustodyJob(member.organisationId, id) : null;
  if (!job) notFound();
  return (
    <div className="flex flex-col gap-8">
      <div>
        <Link href={`/jobs/${job.id}`} className="text-sm text-lake underline">
          ← {job.title}
        </Link>
        <PageHeader title={`Custody and sharing: ${job.title}`} intro={`${job.siteName}. Who handled this job's evidence, who it was shared with, and whether it is held.`} />
      </div>
      <DetailSection id="hold" title="Legal hold">
        <LegalHoldControl jobId={job.id} canManage={can(member.role, "holds.manage")} />
      </DetailSection>
      <DetailSection id="share-links" title="Share links">
        <JobShareLinksPanel jobId={job.id} canManage={can(member.role, "shares.manage")} />
      </DetailSection>
      <DetailSection id="custody" title="Custody log">
        <CustodyLogPanel jobId={job.id} />
      </DetailSection>
    </div>
  );
}
