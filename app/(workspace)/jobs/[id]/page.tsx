// A job's page: its facts and flights, then the sections later parts of Cairn add (components/work/job-sections.tsx).
import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { inScope } from "@/lib/auth/client-scope";
import type { Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { ApiError } from "@/lib/api/errors";
import { getJobOrThrow } from "@/lib/filing/jobs";
import { JobDetailView, type JobDetailData } from "@/components/work/job-detail-view";
import { JOB_SECTIONS } from "@/components/work/job-sections";
import { DetailSection } from "@/components/work/detail-section";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function loadJob(member: Member, id: string) {
  if (!UUID.test(id)) notFound();
  // a client account: only its own clients' work; anything else is "not found"
  if (!(await inScope(member, "job", id.toLowerCase()))) notFound();
  const orgId = member.organisationId;
  try {
    return await getJobOrThrow(orgId, id);
  } catch (err) {
    if (err instanceof ApiError && err.code === "not_found") notFound();
    throw err;
  }
}

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember();
  const job = await loadJob(member, (await params).id);
  return { title: job.title };
}

export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember();
  const job = await loadJob(member, (await params).id);
  // dates become ISO strings on their way to the browser
  const data = JSON.parse(JSON.stringify(job)) as JobDetailData;
  return (
    <div className="flex flex-col gap-8">
      <JobDetailView
        job={data}
        canEdit={can(member.role, "jobs.write")}
        canLogFlight={can(member.role, "flights.write")}
        units={member.preferredUnits}
        me={{ userId: member.userId, role: member.role }}
      />
      {JOB_SECTIONS.map(({ id, title, Component }) => (
        <DetailSection key={id} id={id} title={title}>
          <Component job={job} viewer={member} />
        </DetailSection>
      ))}
    </div>
  );
}
