"use client";
// Import a flight track: choose or drop one GPX 1.1 or CSV file. The size is checked in the browser first
// (naming the file), the exact bytes go to the server as base64 in JSON, and every refusal is listed with
// the file, the line or point and the reason. The help lists the CSV column names the import reads.
import { useId, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { CSV_TRACK_COLUMNS } from "@/lib/tracks/csv-track-columns";
import { MAX_TRACK_BYTES } from "@/lib/tracks/track-types";
import { sendTrackFile } from "./send-track-file";

export function TrackImport({ flightId, onImported }: { flightId: string; onImported: () => void }) {
  const [busy, setBusy] = useState(false);
  const [problems, setProblems] = useState<string[]>([]);
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const helpId = useId();

  async function send(file: File) {
    setProblems([]);
    setBusy(true);
    const r = await sendTrackFile(flightId, file);
    setBusy(false);
    if (input.current) input.current.value = "";
    if (r.ok) onImported();
    else setProblems(r.problems);
  }

  return (
    <div className="flex flex-col gap-3">
      <div
        className={`flex flex-col items-start gap-2 rounded-md border-2 border-dashed p-4 ${over ? "border-lake bg-lake-soft" : "border-line"}`}
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={(e) => {
          e.preventDefault();
          setOver(false);
          const f = e.dataTransfer.files[0];
          if (f) void send(f);
        }}
        data-testid="track-drop"
      >
        <p className="text-sm">Drop the flight&apos;s track here (GPX 1.1 or CSV), or choose it.</p>
        <label className="text-sm">
          <span className="sr-only">Track file</span>
          <input ref={input} type="file" accept=".gpx,.csv,application/gpx+xml,text/csv" aria-describedby={helpId} disabled={busy} onChange={(e) => e.target.files?.[0] && void send(e.target.files[0])} data-testid="track-file" />
        </label>
        {busy && (
          <p role="status" className="text-sm text-ink-2">
            Importing and checking the track…
          </p>
        )}
      </div>
      {problems.length > 0 && (
        <div role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm" data-testid="track-problems">
          <p className="font-medium">The track was not imported:</p>
          <ul className="mt-1 list-disc pl-5">
            {problems.map((p, i) => (
              <li key={i} className="font-mono text-xs">
                {p}
              </li>
            ))}
          </ul>
        </div>
      )}
      <details id={helpId} className="text-sm text-ink-2">
        <summary className="cursor-pointer">What a track file must hold</summary>
        <div className="mt-2 flex flex-col gap-2">
          <p>
            <strong>GPX 1.1</strong>: track points (<code>&lt;trk&gt;&lt;trkseg&gt;&lt;trkpt lat lon&gt;</code>) each with a <code>&lt;time&gt;</code> in UTC; <code>&lt;ele&gt;</code> gives heights, measured from the first point.
          </p>
          <p>
            <strong>CSV</strong>: a header row, then one point per row, in time order, each with its own time. The column names Cairn reads (case and spaces do not matter; any other column refuses the file):
          </p>
          <ul className="list-disc pl-5">
            {CSV_TRACK_COLUMNS.map((c) => (
              <li key={c.kind}>
                <span className="font-medium">{c.kind}</span>
                {c.required ? "" : " (optional)"}: <span className="font-mono">{c.names.join(", ")}</span> — {c.meaning}
              </li>
            ))}
          </ul>
          <p>At most {(MAX_TRACK_BYTES / 1048576).toFixed(0)} MiB. The file is kept exactly as imported, with its SHA-256, and cannot be changed afterwards.</p>
        </div>
      </details>
      <div>
        <Button variant="secondary" onClick={() => input.current?.click()} busy={busy}>
          Choose track file
        </Button>
      </div>
    </div>
  );
}
