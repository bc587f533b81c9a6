"use client";
// All live findings of a job, worst first per severity count, then in recording order, each with its
// still and a link back to its exact frame. Embeddable: <JobFindingsPanel jobId={job.id} canWrite={...} />.
import Link from "next/link";
import { describeMoment, formatMoment } from "@/lib/findings/describe-moment";
import { SEVERITIES_WORST_FIRST, SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import { frameRateFromFps } from "@/lib/recordings/recording-frame-rate";
import { FindingStone } from "./finding-stone";
import { FindingNote } from "./finding-note";
import { FindingStill } from "./finding-still";
import { useFindings } from "./use-findings";

export function JobFindingsPanel({ jobId, canWrite = false, hideTitle = false }: { jobId: string; canWrite?: boolean; hideTitle?: boolean }) {
  const q = useFindings({ jobId });
  const items = q.data?.items ?? [];
  return (
    <section aria-labelledby="job-findings-title" className="flex flex-col gap-3" data-testid="job-findings">
      <h2 id="job-findings-title" className={hideTitle ? "sr-only" : "text-lg font-semibold"}>
        Findings
      </h2>
      {q.error && <p role="alert">{q.error.message}</p>}
      {q.data && (
        <ul className="flex flex-wrap gap-2 text-sm" aria-label="Findings by severity">
          {SEVERITIES_WORST_FIRST.map((s) => (
            <li key={s} className="flex items-center gap-1 rounded border border-line px-2 py-1">
              <FindingStone severity={s} />
              <span>{SEVERITY_SCALE[s].label}</span>
              <span className="font-mono">{items.filter((f) => f.severity === s).length}</span>
            </li>
          ))}
        </ul>
      )}
      {q.data && items.length === 0 && <p className="rounded-md border border-dashed border-line px-4 py-6 text-center text-sm text-ink-2">No findings in this job yet. Open a recording to mark them.</p>}
      <ol className="flex flex-col gap-2">
        {items.map((f) => {
          // seconds are exact per recording; the moment label uses the frame and the rate those seconds imply
          const rate = f.startFrame > 0 && f.startSec > 0 ? frameRateFromFps(f.startFrame / f.startSec) : { num: 30, den: 1 };
          return (
            <li key={f.id} className="flex gap-3 rounded-md border border-line p-2" data-testid="job-finding">
              <FindingStill finding={f} canWrite={canWrite} width={140} />
              <div className="flex min-w-0 flex-col gap-0.5 text-sm">
                <span className="flex items-center gap-1.5">
                  <FindingStone severity={f.severity} />
                  <span className="font-semibold">{SEVERITY_SCALE[f.severity].label}</span>
                  {f.categoryName && <span className="text-ink-2">· {f.categoryName}</span>}
                </span>
                <Link href={`/recordings/${f.recordingId}?finding=${f.id}`} className="truncate text-lake underline">
                  {f.recordingName}
                </Link>
                <span className="font-mono text-xs">{formatMoment(describeMoment(f.startFrame, rate))}</span>
                <FindingNote note={f.note} className="line-clamp-2" />
              </div>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
