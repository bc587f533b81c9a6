// Adapter for the job page's section list (components/work/job-sections.tsx): the job's share links.
import { can } from "@/lib/auth/permissions";
import type { JobSectionProps } from "@/components/work/job-sections";
import { JobShareLinksPanel } from "./job-share-links-panel";

export function JobShareLinksSection({ job, viewer }: JobSectionProps) {
  return <JobShareLinksPanel jobId={job.id} canManage={can(viewer.role, "shares.manage")} />;
}
