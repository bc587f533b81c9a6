// Adapter for the job page's section list (components/work/job-sections.tsx): legal hold and the
// job's custody trail, with a link to the full custody page.
import Link from "next/link";
import { can } from "@/lib/auth/permissions";
import type { JobSectionProps } from "@/components/work/job-sections";
import { LegalHoldControl } from "./legal-hold-control";
import { CustodyLogPanel } from "./custody-log-panel";

export function JobCustodySection({ job, viewer }: JobSectionProps) {
  if (!can(viewer.role, "custody.read")) return <p className="text-sm text-ink-2">The custody log is open to the crew.</p>;
  return (
    <div className="flex flex-col gap-4">
      <LegalHoldControl jobId={job.id} canManage={can(viewer.role, "holds.manage")} />
      <CustodyLogPanel jobId={job.id} />
      <Link href={`/custody/jobs/${job.id}`} className="text-sm text-lake underline">
        Open the job&apos;s custody and sharing page
      </Link>
    </div>
  );
}
