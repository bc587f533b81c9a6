// Adapters that place the recordings, findings and reports panels in the job and flight pages'
// section lists, with the viewer's permissions decided on the server.
import { can } from "@/lib/auth/permissions";
import { RecordingsTable } from "@/components/recordings/recordings-table";
import { JobFindingsPanel } from "@/components/findings/job-findings-panel";
import { JobReportsPanel } from "@/components/reports/job-reports-panel";
import type { JobSectionProps } from "./job-sections";
import type { FlightSectionProps } from "./flight-sections";

export function JobRecordingsSection({ job, viewer }: JobSectionProps) {
  return <RecordingsTable jobId={job.id} canTag={can(viewer.role, "recordings.tag")} canDownload={can(viewer.role, "originals.download")} />;
}

export function FlightRecordingsSection({ flight, viewer }: FlightSectionProps) {
  return <RecordingsTable flightId={flight.id} canTag={can(viewer.role, "recordings.tag")} canDownload={can(viewer.role, "originals.download")} />;
}

export function JobFindingsSection({ job, viewer }: JobSectionProps) {
  return <JobFindingsPanel jobId={job.id} canWrite={can(viewer.role, "findings.write")} hideTitle />;
}

export function JobReportsSection({ job, viewer }: JobSectionProps) {
  return <JobReportsPanel jobId={job.id} canBuild={can(viewer.role, "reports.build")} canApprove={can(viewer.role, "reports.approve")} hideTitle />;
}
