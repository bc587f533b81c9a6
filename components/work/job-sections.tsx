// The sections that later parts of Cairn add to a job's page, in reading order after the job's
// flights: its recordings, findings, reports and share links. Each entry is a component (server or
// client) given the job and the viewer; the page renders each under its own heading. The list is
// empty until those parts exist, so the page never shows a section with nothing real in it.
import type { ComponentType } from "react";
import type { JobDetail } from "@/lib/work/jobs";
import type { Member } from "@/lib/auth/load-member";

export type JobSectionProps = { job: JobDetail; viewer: Member };
export type JobSection = { id: string; title: string; Component: ComponentType<JobSectionProps> };

export const JOB_SECTIONS: JobSection[] = [];
