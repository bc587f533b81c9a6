"use client";
// What became of each file of this session, in words: stored with its hash, the same bytes as a
// recording already held (and where), refused with the server's reason, or stopped.
// "Refused" and "stopped" differ: a refused file is not accepted however often it is sent (and the
// widget above drops it); a stopped one continues when retried or added again.
import { HashText } from "@/components/ui/hash-text";
import { formatBytes } from "@/lib/uploads/format-bytes";
import type { FileReport } from "./recording-uploader";

function Line({ r }: { r: FileReport }) {
  const o = r.outcome;
  if (r.refused) return <Refused reason={r.refused} />;
  if (r.track) {
    return (
      <p className="flex flex-wrap items-center gap-2 text-good">
        <span>
          <span aria-hidden className="mr-1">✓</span>
          <span className="font-medium">Imported as the flight&apos;s track</span> ({r.track.pointCount} points), kept unaltered, SHA-256
        </span>
        <HashText value={r.track.sha256} />
      </p>
    );
  }
  if (r.error) {
    return (
      <p className="text-bad">
        <span aria-hidden className="mr-1">!</span>
        <span className="font-medium">Stopped</span>, not stored yet: {r.error}
      </p>
    );
  }
  if (!o) return <p className="text-ink-2">{r.received ? "Received; checking and storing…" : "Uploading…"}</p>;
  switch (o.state) {
    case "receiving":
      return <p className="text-ink-2">Uploading…</p>;
    case "storing":
      return <p className="text-ink-2">Received; checking and storing…</p>;
    case "stored":
      return (
        <p className="flex flex-wrap items-center gap-2 text-good">
          <span>
            <span aria-hidden className="mr-1">✓</span>
            <span className="font-medium">Stored</span>, original unaltered, SHA-256
          </span>
          <HashText value={o.sha256} />
        </p>
      );
    case "duplicate": {
      const d = o.duplicateOf;
      return (
        <p className="flex flex-wrap items-center gap-2">
          <span>
            <span aria-hidden className="mr-1">≡</span>
            <span className="font-medium">Same bytes as “{d.originalName}”</span> ({d.jobTitle}, flight {d.flownOn}
            {d.relativePath && d.relativePath !== d.originalName ? `, ${d.relativePath}` : ""}).{" "}
            {o.linked ? "Filed in this flight too; no second copy stored." : "Already in this flight; nothing new stored."}
          </span>
          <HashText value={o.sha256} />
        </p>
      );
    }
    case "refused":
      return <Refused reason={o.reason} />;
  }
}

function Refused({ reason }: { reason: string }) {
  return (
    <p className="text-bad">
      <span aria-hidden className="mr-1">✕</span>
      <span className="font-medium">Refused</span>: {reason}{" "}
      <span className="text-ink-2">Sending it again gets the same answer, so it was taken off the uploader.</span>
    </p>
  );
}

export function stateOf(r: FileReport): string {
  if (r.refused) return "refused";
  if (r.track) return "track";
  if (r.error) return "error";
  return r.outcome?.state ?? "uploading";
}

export function UploadOutcomeList({ reports }: { reports: FileReport[] }) {
  if (reports.length === 0) return null;
  const stored = reports.filter((r) => r.outcome?.state === "stored").length;
  const duplicates = reports.filter((r) => r.outcome?.state === "duplicate").length;
  const refused = reports.filter((r) => stateOf(r) === "refused").length;
  const stopped = reports.filter((r) => stateOf(r) === "error").length;
  const tracks = reports.filter((r) => stateOf(r) === "track").length;
  return (
    <section aria-labelledby="outcomes-title" className="flex flex-col gap-2">
      <h2 id="outcomes-title" className="text-lg font-semibold">
        This session
      </h2>
      <p className="text-sm text-ink-2" aria-live="polite">
        {reports.length} {reports.length === 1 ? "file" : "files"} · {stored} stored · {duplicates} already held · {refused} refused{stopped > 0 ? ` · ${stopped} stopped` : ""}{tracks > 0 ? ` · ${tracks} track imported` : ""}
      </p>
      <ul className="divide-y divide-line rounded-md border border-line" aria-live="polite">
        {reports.map((r) => (
          <li key={r.fileId} className="flex flex-col gap-1 px-3 py-2 text-sm" data-upload-file={r.name} data-upload-state={stateOf(r)}>
            <span className="font-medium break-all">
              {r.name}
              {r.relativePath && r.relativePath !== r.name && <span className="ml-2 font-mono text-xs font-normal text-ink-2">{r.relativePath}</span>}
              {r.size !== undefined && <span className="ml-2 text-xs font-normal text-ink-2 tabular">{formatBytes(r.size)}</span>}
            </span>
            <Line r={r} />
          </li>
        ))}
      </ul>
    </section>
  );
}
