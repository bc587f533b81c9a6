"use client";
// A job's page: where, what, when, who, and the flights flown for it.
import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { ASSET_KIND_LABELS, JOB_STATUS_MEANING, type JobStatus } from "@/lib/validation/work";
import { isOverdue } from "@/lib/filing/format-work-dates";
import type { AltitudeUnit } from "@/lib/filing/format-altitude";
import type { Role } from "@/db/schema/types";
import { JobForm, type JobFormRow } from "./job-form";
import { JobStatusBadge } from "./job-status";
import { FlightsTable } from "./flights-table";
import { FlightForm } from "./flight-form";
import { Coordinates } from "./coordinates";
import { DetailSection, Fact } from "./detail-section";
import { JobEvidencePackages } from "@/components/evidence-packages/job-evidence-packages";

export type JobDetailData = JobFormRow & {
  legalHold: boolean;
  createdAt: string;
  siteName: string;
  siteTimeZone: string;
  siteAddress: string | null;
  siteLatitude: number | null;
  siteLongitude: number | null;
  siteAssetKind: keyof typeof ASSET_KIND_LABELS;
  siteLaunchNotes: string | null;
  clientId: string;
  clientName: string;
  pilotName: string | null;
  reviewerName: string | null;
};

export function JobDetailView({
  job,
  canEdit,
  canLogFlight,
  units,
  me,
}: {
  job: JobDetailData;
  canEdit: boolean;
  canLogFlight: boolean;
  units: AltitudeUnit;
  me: { userId: string; role: Role };
}) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const [logging, setLogging] = useState(false);
  const overdue = isOverdue(job.dueDate, job.status, job.siteTimeZone);
  const none = (text: string) => <span className="text-ink-2">{text}</span>;

  return (
    <div className="flex flex-col gap-8">
      <div>
        <Link href="/jobs" className="text-sm text-lake underline">
          ← All jobs
        </Link>
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <h1 className="text-2xl font-semibold tracking-tight">{job.title}</h1>
          <JobStatusBadge status={job.status} />
          {overdue && <span className="text-sm font-semibold text-bad">Overdue</span>}
          <div className="ml-auto flex gap-2">
            {canLogFlight && !job.archivedAt && <Button onClick={() => setLogging(true)}>Log flight</Button>}
            {canEdit && (
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Edit job
              </Button>
            )}
          </div>
        </div>
        <p className="mt-1 text-sm text-ink-2">
          {JOB_STATUS_MEANING[job.status].label}: {JOB_STATUS_MEANING[job.status].meaning}
        </p>
        {job.archivedAt && (
          <p role="status" className="mt-3 rounded-md border border-line bg-paper-2 px-3 py-2 text-sm">
            Archived on <span className="font-mono">{job.archivedAt.slice(0, 10)}</span>. It stays on record; restore it from “Edit job”.
          </p>
        )}
      </div>

      <div className="grid gap-6 lg:grid-cols-3">
        <DetailSection id="site" title="Site">
          <dl className="flex flex-col gap-3">
            <Fact label="Site">
              <span className="font-medium">{job.siteName}</span> · {ASSET_KIND_LABELS[job.siteAssetKind]}
            </Fact>
            <Fact label="Client">{job.clientName}</Fact>
            <Fact label="Address">{job.siteAddress ?? none("No address")}</Fact>
            <Fact label="Position">
              <Coordinates lat={job.siteLatitude} lon={job.siteLongitude} />
            </Fact>
            <Fact label="Time zone">
              <span className="font-mono text-xs">{job.siteTimeZone}</span>
            </Fact>
            <Fact label="Launch-point notes">{job.siteLaunchNotes ? <span className="whitespace-pre-wrap">{job.siteLaunchNotes}</span> : none("None")}</Fact>
          </dl>
        </DetailSection>
        <DetailSection id="scope" title="Scope">
          {job.scope ? <p className="whitespace-pre-wrap text-sm">{job.scope}</p> : <p className="text-sm text-ink-2">No scope written yet.</p>}
        </DetailSection>
        <DetailSection id="crew" title="Schedule and crew">
          <dl className="flex flex-col gap-3">
            <Fact label="Due">
              {job.dueDate ? (
                <>
                  <span className="font-mono">{job.dueDate}</span> <span className="text-xs text-ink-2">({job.siteTimeZone})</span>
                </>
              ) : (
                none("No due date")
              )}
            </Fact>
            <Fact label="Pilot">{job.pilotName ?? none("Not assigned")}</Fact>
            <Fact label="Reviewer">{job.reviewerName ?? none("Not assigned")}</Fact>
            {job.legalHold && <Fact label="Legal hold">On: recordings of this job cannot be deleted.</Fact>}
          </dl>
        </DetailSection>
      </div>

      <DetailSection id="flights" title="Flights" actions={canLogFlight && !job.archivedAt && <Button variant="secondary" onClick={() => setLogging(true)}>Log flight</Button>}>
        <FlightsTable
          units={units}
          jobId={job.id}
          empty={{
            title: "No flights for this job yet",
            next: canLogFlight ? "After each sortie, log the flight here; its recordings are filed to it." : "Flights appear here once the pilot logs them.",
          }}
        />
      </DetailSection>

      <JobEvidencePackages jobId={job.id} role={me.role} />

      {editing && <JobForm row={job} onClose={() => setEditing(false)} onSaved={() => router.refresh()} />}
      {logging && <FlightForm row={null} jobId={job.id} units={units} me={me} onClose={() => setLogging(false)} />}
    </div>
  );
}
