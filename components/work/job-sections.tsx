// The sections that later parts of Cairn add to a job's page, in reading order after the job's
// flights: its recordings, findings, reports and share links. Each entry is a component (server or
// client) given the job and the viewer; the page renders each under its own heading.
import type { ComponentType } from "react";
import type { JobDetail } from "@/lib/filing/jobs";
import type { Member } from "@/lib/auth/load-member";
import { JobShareLinksSection } from "@/components/sharing/job-share-links-section";
import { JobCustodySection } from "@/components/custody/job-custody-section";
import { JobFindingsSection, JobRecordingsSection, JobReportsSection } from "./evidence-sections";

export type JobSectionProps = { job: JobDetail; viewer: Member };
export type JobSection = { id: string; title: string; Component: ComponentType<JobSectionProps> };

export const JOB_SECTIONS: JobSection[] = [
  { id: "recordings", title: "Recordings", Component: JobRecordingsSection },
  { id: "findings", title: "Findings", Component: JobFindingsSection },
  { id: "reports", title: "Reports", Component: JobReportsSection },
  { id: "share-links", title: "Share links", Component: JobShareLinksSection },
  { id: "custody", title: "Custody and legal hold", Component: JobCustodySection },
];
