"use client";
// A flight's page: when, who, with what, from where, how high; later parts add its recordings.
import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import type { Role } from "@/db/schema/types";
import type { JobStatus } from "@/lib/validation/work";
import { formatAltitude, type AltitudeUnit } from "@/lib/filing/format-altitude";
import { FlightForm, type FlightFormRow } from "./flight-form";
import { JobStatusBadge } from "./job-status";
import { Coordinates } from "./coordinates";
import { DetailSection, Fact } from "./detail-section";
import { AltitudeCautions } from "./altitude-cautions";

export type FlightDetailData = FlightFormRow & {
  jobTitle: string;
  jobStatus: JobStatus;
  siteId: string;
  siteName: string;
  siteTimeZone: string;
  clientName: string;
  pilotName: string | null;
  createdAt: string;
};

export function FlightDetailView({ flight, canEdit, units, me }: { flight: FlightDetailData; canEdit: boolean; units: AltitudeUnit; me: { userId: string; role: Role } }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const none = (text: string) => <span className="text-ink-2">{text}</span>;
  const altitude = flight.maxAltitudeAglM == null ? null : formatAltitude(flight.maxAltitudeAglM, units);
  return (
    <div className="flex flex-col gap-8">
      <div>
        <Link href={`/jobs/${flight.jobId}`} className="text-sm text-lake underline">
          ← {flight.jobTitle}
        </Link>
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <h1 className="text-2xl font-semibold tracking-tight">
            Flight of <span className="font-mono">{flight.flownOn}</span>
          </h1>
          <span className="text-sm text-ink-2">{flight.siteTimeZone}</span>
          {canEdit && (
            <Button variant="secondary" className="ml-auto" onClick={() => setEditing(true)}>
              Edit flight
            </Button>
          )}
        </div>
        {flight.archivedAt && (
          <p role="status" className="mt-3 rounded-md border border-line bg-paper-2 px-3 py-2 text-sm">
            Archived on <span className="font-mono">{flight.archivedAt.slice(0, 10)}</span>. It stays on record; restore it from “Edit flight”.
          </p>
        )}
      </div>

      <div className="grid gap-6 lg:grid-cols-2">
        <DetailSection id="flight-facts" title="Flight">
          <dl className="grid grid-cols-1 gap-3 sm:grid-cols-2">
            <Fact label="Job">
              <Link href={`/jobs/${flight.jobId}`} className="text-lake underline">
                {flight.jobTitle}
              </Link>{" "}
              <JobStatusBadge status={flight.jobStatus} />
            </Fact>
            <Fact label="Site">
              {flight.siteName} · {flight.clientName}
            </Fact>
            <Fact label="Flown on">
              <span className="font-mono">{flight.flownOn}</span> <span className="text-xs text-ink-2">({flight.siteTimeZone})</span>
            </Fact>
            <Fact label="Pilot in command">{flight.pilotName ?? none("Not recorded")}</Fact>
            <Fact label="Aircraft">{flight.aircraft ?? none("Not recorded")}</Fact>
            <Fact label="Launch point">
              <Coordinates lat={flight.launchLatitude} lon={flight.launchLongitude} />
              {flight.launchNotes && <span className="mt-1 block whitespace-pre-wrap">{flight.launchNotes}</span>}
            </Fact>
          </dl>
        </DetailSection>
        <DetailSection id="altitude" title="Maximum altitude above ground">
          {altitude ? (
            <div className="flex flex-col gap-3">
              <p className="font-mono text-2xl" data-testid="max-altitude">
                {altitude.primary} <span className="text-base text-ink-2">({altitude.secondary})</span>
              </p>
              <AltitudeCautions metres={flight.maxAltitudeAglM} />
            </div>
          ) : (
            <p className="text-sm text-ink-2">Not recorded.</p>
          )}
        </DetailSection>
      </div>

      <DetailSection id="flight-notes" title="Notes">
        {flight.notes ? <p className="whitespace-pre-wrap text-sm">{flight.notes}</p> : <p className="text-sm text-ink-2">No notes.</p>}
      </DetailSection>

      {editing && <FlightForm row={flight} jobId={flight.jobId} units={units} me={me} onClose={() => setEditing(false)} onSaved={() => router.refresh()} />}
    </div>
  );
}
