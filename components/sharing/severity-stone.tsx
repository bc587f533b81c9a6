// The finding marker: a small stone whose outline grows thicker with severity (docs/look.md). It always
// sits beside the severity word; the shape repeats the word, it never replaces it.
import { SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";

export function SeverityStone({ severity, size = 16 }: { severity: Severity; size?: number }) {
  const w = SEVERITY_SCALE[severity].outlinePx;
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" className="shrink-0">
      <path d="M3 11.5C3 7 5.2 3.5 8.6 3.5S14 6.6 14 10c0 2.3-1.9 3-5.4 3S3 13.2 3 11.5z" className="fill-paper stroke-ink" strokeWidth={w} strokeLinejoin="round" />
    </svg>
  );
}
