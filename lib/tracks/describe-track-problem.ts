import type { TrackProblem } from "./track-types";

/** "flight.gpx, line 40, point 12: the time has no time zone ..." - what a refusal says, one problem per line. */
export function describeTrackProblem(fileName: string, p: TrackProblem): string {
  const where = [p.line !== null ? `line ${p.line}` : null, p.point !== null ? `point ${p.point}` : null].filter(Boolean).join(", ");
  return `${fileName}${where ? `, ${where}` : ""}: ${p.reason}`;
}
