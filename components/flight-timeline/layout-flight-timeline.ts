// Widths of a flight timeline: files as wide as they are long, gaps as wide as they are (when their
// length is known), an unknown gap as a fixed narrow mark, and a floor so a 2-second file stays
// visible next to a 20-minute one.
export interface TimelinePiece {
  kind: "file" | "gap";
  seconds: number | null;
}

const MIN_SHARE = 0.03; // 3 % of the width at least for a file
const UNKNOWN_GAP_SHARE = 0.02;
const MIN_GAP_SHARE = 0.008;

export function layoutFlightTimeline(pieces: readonly TimelinePiece[]): number[] {
  const known = pieces.reduce((s, p) => s + (p.seconds ?? 0), 0);
  const raw = pieces.map((p) => {
    if (p.kind === "gap") {
      if (p.seconds === null) return UNKNOWN_GAP_SHARE;
      return Math.max(MIN_GAP_SHARE, known > 0 ? p.seconds / known : 0);
    }
    return Math.max(MIN_SHARE, known > 0 && p.seconds !== null ? p.seconds / known : 1 / Math.max(1, pieces.length));
  });
  const total = raw.reduce((a, b) => a + b, 0);
  return raw.map((r) => (total > 0 ? (r / total) * 100 : 0));
}
