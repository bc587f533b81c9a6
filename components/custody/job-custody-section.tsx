// Adapter for the job page's section list (components/work/job-sections.tsx): the legal hold, and a
// link to the job's custody log (its own page, which pages and filters it) rather than the log itself.
import { can } from "@/lib/auth/permissions";
import type { JobSectionProps } from "@/components/work/job-sections";
import { LegalHoldControl } from "./legal-hold-control";
import { CustodyLogLink } from "./custody-log-link";

export function JobCustodySection({ job, viewer }: JobSectionProps) {
  if (!can(viewer.role, "custody.read")) return <p className="text-sm text-ink-2">The custody log is open to the crew.</p>;
  return (
    <div className="flex flex-col gap-4">
      <LegalHoldControl jobId={job.id} canManage={can(viewer.role, "holds.manage")} />
      <CustodyLogLink jobId={job.id} />
    </div>
  );
}
