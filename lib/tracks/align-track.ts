// The recorder's clock and the track's clock differ (a controller set to local time, a clock never set,
// drift). Cairn keeps one offset per track: track time = recorder time + offset.
//
// A recording's start on the recorder's clock is its file time (when the recorder closed the file)
// minus its length, as the demo seed and the upload path store it (recordings.recorder_modified_at).
//
// The proposal tries every offset a clock set to another time zone could have (whole quarter hours up
// to 14 h either way: UTC offsets in use run from -12:00 to +14:00 in steps of 15 minutes or more, IANA
// time zone database) and keeps the one under which the recordings overlap the track the most, the
// smallest such offset on a tie. How sure it is: file times count whole seconds at best (FAT keeps them
// to 2 s, Microsoft's FAT specification), and the recorder's clock may be off by more, so a proposal
// is rough until the pilot matches a frame to a track point.
//
// The pilot's correction: a frame of a recording and the track point showing the same moment (the
// take-off, a turn). offset = point time - (recording start + frame / fps). Its uncertainty is half a
// frame plus half the spacing of the track points around the chosen one (the true moment lies between
// its neighbours, and interpolation cannot tell where).

export type RecordingClock = { id: string; startMs: number; endMs: number };

export const FILE_TIME_UNCERTAINTY_MS = 2_000;
const QUARTER_HOUR_MS = 15 * 60_000;
const MAX_ZONE_MS = 14 * 3_600_000;

export type ProposedOffset = { offsetMs: number; overlapMs: number; uncertaintyMs: number };

export function proposeOffset(recordings: readonly RecordingClock[], track: { startMs: number; endMs: number }): ProposedOffset {
  let best: ProposedOffset = { offsetMs: 0, overlapMs: overlap(recordings, track, 0), uncertaintyMs: FILE_TIME_UNCERTAINTY_MS };
  for (let k = -MAX_ZONE_MS / QUARTER_HOUR_MS; k <= MAX_ZONE_MS / QUARTER_HOUR_MS; k++) {
    const offsetMs = k * QUARTER_HOUR_MS;
    const o = overlap(recordings, track, offsetMs);
    if (o > best.overlapMs || (o === best.overlapMs && Math.abs(offsetMs) < Math.abs(best.offsetMs))) best = { offsetMs, overlapMs: o, uncertaintyMs: FILE_TIME_UNCERTAINTY_MS };
  }
  return best;
}

/** How much of the recordings (ms) falls inside the track when the recorder's clock is shifted by offset. */
export function overlap(recordings: readonly RecordingClock[], track: { startMs: number; endMs: number }, offsetMs: number): number {
  let total = 0;
  for (const r of recordings) total += Math.max(0, Math.min(r.endMs + offsetMs, track.endMs) - Math.max(r.startMs + offsetMs, track.startMs));
  return total;
}

export function offsetFromFrameMatch(input: { recordingStartMs: number; frame: number; fps: number; pointTimeMs: number; prevPointMs: number | null; nextPointMs: number | null }) {
  const frameMs = (input.frame * 1000) / input.fps;
  const offsetMs = input.pointTimeMs - (input.recordingStartMs + frameMs);
  const spacing = Math.max(input.prevPointMs === null ? 0 : input.pointTimeMs - input.prevPointMs, input.nextPointMs === null ? 0 : input.nextPointMs - input.pointTimeMs);
  return { offsetMs, uncertaintyMs: 500 / input.fps + spacing / 2 };
}

/** How sure, in words: shown beside every figure that depends on the alignment. */
export function describeAlignment(a: { method: string; uncertaintyMs: number } | null, fps: number | null): string {
  if (!a) return "Not aligned: no recording has a file time to align with";
  const pm = `± ${(a.uncertaintyMs / 1000).toFixed(a.uncertaintyMs < 1000 ? 2 : 1)} s`;
  if (a.method === "file_times") return `Rough (${pm} at best): proposed from the recordings' file times; the recorder's clock was not checked against the track. Match a frame to a track point to be sure.`;
  const frames = fps ? a.uncertaintyMs / (1000 / fps) : null;
  return `Matched by the pilot (${pm}${frames !== null ? `, about ${frames.toFixed(1)} frames` : ""}): a frame was matched to a track point; other files of the flight also depend on their file times.`;
}
