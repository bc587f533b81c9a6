// A job's status as a word with a shape (never colour alone: WCAG 2.2 SC 1.4.1, docs/look.md), and the
// legend that says what each status means.
import { JOB_STATUSES, JOB_STATUS_MEANING, type JobStatus } from "@/lib/validation/work";

// the circle fills as the work advances; closed is a square: finished and filed
const SHAPE: Record<JobStatus, string> = { planned: "○", fieldwork: "◔", review: "◑", delivered: "●", closed: "■" };
const TONE: Record<JobStatus, string> = {
  planned: "border-line text-ink",
  fieldwork: "border-lake text-lake",
  review: "border-warn text-warn",
  delivered: "border-good text-good",
  closed: "border-line text-ink-2",
};

export function JobStatusBadge({ status }: { status: JobStatus }) {
  const s = JOB_STATUS_MEANING[status];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-medium ${TONE[status]}`} title={s.meaning}>
      <span aria-hidden>{SHAPE[status]}</span>
      {s.label}
    </span>
  );
}

export function JobStatusLegend() {
  return (
    <details className="rounded-md border border-line bg-paper px-3 py-2 text-sm" open>
      <summary className="cursor-pointer font-medium">What the statuses mean</summary>
      <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
        {JOB_STATUSES.map((s) => (
          <div key={s} className="contents">
            <dt>
              <JobStatusBadge status={s} />
            </dt>
            <dd className="text-ink-2">{JOB_STATUS_MEANING[s].meaning}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}
