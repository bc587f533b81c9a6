// A finding's stone: the outline grows thicker with severity (docs/look.md). Always drawn beside the
// severity word or inside a control labelled with it; the shape repeats the word, never replaces it.
import { SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";

export function FindingStone({ severity, size = 16, pin = false }: { severity: Severity; size?: number; pin?: boolean }) {
  const w = SEVERITY_SCALE[severity].outlinePx;
  return (
    <svg width={size} height={pin ? size * 1.5 : size} viewBox={pin ? "0 0 16 24" : "0 0 16 16"} aria-hidden="true" className="shrink-0 overflow-visible" data-severity={severity}>
      {pin && <line x1="8" y1="13" x2="8" y2="24" className="stroke-ink" strokeWidth="1.25" />}
      <path d="M2.5 10.5C2.5 6 5 2.5 8.6 2.5S14 5.8 14 9.2c0 2.4-2 3.3-5.6 3.3S2.5 12.4 2.5 10.5z" className="fill-paper stroke-ink" strokeWidth={w} strokeLinejoin="round" />
    </svg>
  );
}
