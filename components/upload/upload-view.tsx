"use client";
// The upload page: choose the job and flight the SD card's files belong to (or log the flight on
// the spot), drop the folder into the uploader, see what became of every file, and the flight's
// recordings with their hashes underneath.
import dynamic from "next/dynamic";
import { useCallback, useMemo, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FetchError, fetchJson } from "@/components/fetch-json";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { RecordingsTable } from "@/components/recordings/recordings-table";
import type { UploadFlight, UploadTarget } from "@/lib/uploads/list-upload-targets";
import { UploadOutcomeList } from "./upload-outcome-list";
import type { FileReport } from "./recording-uploader";

// Uppy touches the browser when it starts: render it on the client only
const RecordingUploader = dynamic(() => import("./recording-uploader").then((m) => m.RecordingUploader), {
  ssr: false,
  loading: () => <div className="h-[420px] animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading the uploader" />,
});

function localToday(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

const flightLabel = (f: UploadFlight) => [f.flownOn, f.aircraft, f.pilotName].filter(Boolean).join(" · ");

function NewFlightForm({ jobId, onCreated, onCancel }: { jobId: string; onCreated: (f: UploadFlight) => void; onCancel: () => void }) {
  const [flownOn, setFlownOn] = useState(localToday);
  const [aircraft, setAircraft] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  return (
    <form
      className="flex flex-wrap items-end gap-3 rounded-md border border-line bg-paper-2/50 p-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setError(null);
        try {
          const f = await fetchJson<{ id: string; flownOn: string; aircraft: string | null }>("/api/flights", { method: "POST", json: { jobId, flownOn, aircraft } });
          onCreated({ id: f.id, flownOn: f.flownOn ?? flownOn, aircraft: f.aircraft ?? (aircraft || null), pilotName: null });
        } catch (err) {
          const fe = err as FetchError;
          setFieldErrors(fe.fields ?? {});
          setError(fe.status === 404 ? "Flights cannot be logged from here yet. Log the flight on the Flights page, then come back." : fe.message);
        } finally {
          setBusy(false);
        }
      }}
    >
      <Field label="Flown on" type="date" value={flownOn} onChange={(e) => setFlownOn(e.target.value)} required error={fieldErrors.flownOn?.[0]} />
      <Field label="Aircraft (optional)" value={aircraft} onChange={(e) => setAircraft(e.target.value)} maxLength={120} error={fieldErrors.aircraft?.[0]} />
      <Button type="submit" busy={busy}>
        Log flight
      </Button>
      <Button type="button" variant="quiet" onClick={onCancel}>
        Cancel
      </Button>
      {error && (
        <p role="alert" className="w-full text-sm text-bad">
          {error}
        </p>
      )}
    </form>
  );
}

export function UploadView({
  targets,
  canCreateFlight,
  canTag,
  canDownload,
  maxFileBytes,
  initialJobId,
  initialFlightId,
}: {
  targets: UploadTarget[];
  canCreateFlight: boolean;
  canTag: boolean;
  canDownload: boolean;
  maxFileBytes: number;
  initialJobId?: string;
  initialFlightId?: string;
}) {
  const [jobs, setJobs] = useState(targets);
  const initialJob = jobs.find((j) => j.jobId === initialJobId) ?? jobs.find((j) => j.flights.some((f) => f.id === initialFlightId));
  const [jobId, setJobId] = useState(initialJob?.jobId ?? "");
  const [flightId, setFlightId] = useState(initialJob?.flights.find((f) => f.id === initialFlightId)?.id ?? initialJob?.flights[0]?.id ?? "");
  const [creating, setCreating] = useState(false);
  const [reports, setReports] = useState<Map<string, FileReport>>(new Map());
  const job = jobs.find((j) => j.jobId === jobId);
  const flight = job?.flights.find((f) => f.id === flightId);
  const queryClient = useQueryClient();
  const onReport = useCallback(
    (r: FileReport) => {
      setReports((prev) => new Map(prev).set(r.fileId, r));
      // a stored or linked file is a new row in the flight's list
      if (r.outcome?.state === "stored" || r.outcome?.state === "duplicate") void queryClient.invalidateQueries({ queryKey: ["recordings"] });
    },
    [queryClient],
  );
  const reportList = useMemo(() => [...reports.values()], [reports]);

  if (jobs.length === 0) {
    return (
      <>
        <PageHeader title="Upload recordings" />
        <EmptyState title="No open jobs" next="Recordings are filed to a flight of a job. Ask the owner to create the job first; closed and archived jobs take no uploads." />
      </>
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Upload recordings"
        intro="Choose where the files belong, then drop the SD card's folder. Every file is checked by its bytes, hashed (SHA-256) and kept unaltered; processing starts on its own."
      />
      <section aria-labelledby="target-title" className="flex flex-col gap-3">
        <h2 id="target-title" className="text-lg font-semibold">
          1. Where do these files go?
        </h2>
        <div className="flex flex-wrap items-end gap-3">
          <SelectField
            label="Job"
            value={jobId}
            onChange={(e) => {
              const j = jobs.find((x) => x.jobId === e.target.value);
              setJobId(e.target.value);
              setFlightId(j?.flights[0]?.id ?? "");
              setCreating(false);
            }}
            className="min-w-72"
          >
            <option value="">Choose a job</option>
            {jobs.map((j) => (
              <option key={j.jobId} value={j.jobId}>
                {j.title} · {j.siteName}
              </option>
            ))}
          </SelectField>
          <SelectField label="Flight" value={flightId} onChange={(e) => setFlightId(e.target.value)} disabled={!job || job.flights.length === 0} className="min-w-64">
            {job && job.flights.length === 0 && <option value="">No flights logged yet</option>}
            {!job && <option value="">Choose a job first</option>}
            {job?.flights.map((f) => (
              <option key={f.id} value={f.id}>
                {flightLabel(f)}
              </option>
            ))}
          </SelectField>
          {canCreateFlight && job && !creating && (
            <Button type="button" variant="secondary" onClick={() => setCreating(true)}>
              New flight
            </Button>
          )}
        </div>
        {creating && job && (
          <NewFlightForm
            jobId={job.jobId}
            onCancel={() => setCreating(false)}
            onCreated={(f) => {
              setJobs((all) => all.map((j) => (j.jobId === job.jobId ? { ...j, flights: [f, ...j.flights] } : j)));
              setFlightId(f.id);
              setCreating(false);
            }}
          />
        )}
      </section>

      {job && flight ? (
        <>
          <section aria-labelledby="files-title" className="flex flex-col gap-3">
            <h2 id="files-title" className="text-lg font-semibold">
              2. Add the files
            </h2>
            <p className="text-sm">
              Files you add now go to <span className="font-medium">{job.title}</span>, flight <span className="font-mono">{flightLabel(flight)}</span>.
            </p>
            <aside role="note" className="rounded-md border border-line bg-paper-2/60 px-3 py-2 text-sm">
              <span aria-hidden className="mr-1">↻</span>
              Connection dropped or page reloaded? Add the same files again from the same folder: each one continues from where it stopped. Pause, resume and retry
              each file with the buttons beside it. Sizes on Cairn&rsquo;s pages are in decimal units: 1 MB is 1,000,000 bytes, as SD cards are labelled.
            </aside>
            <RecordingUploader jobId={job.jobId} flightId={flight.id} maxFileBytes={maxFileBytes} onReport={onReport} />
            <UploadOutcomeList reports={reportList} />
          </section>
          <section aria-labelledby="recordings-title" className="flex flex-col gap-3">
            <h2 id="recordings-title" className="text-lg font-semibold">
              3. Recordings of this flight
            </h2>
            <RecordingsTable key={flight.id} flightId={flight.id} canTag={canTag} canDownload={canDownload} />
          </section>
        </>
      ) : (
        <p className="text-sm text-ink-2">{job ? "Choose a flight, or log a new one, to start adding files." : "Choose a job to start."}</p>
      )}
    </div>
  );
}
