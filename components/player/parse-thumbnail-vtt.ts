// Reads a WebVTT scrub-thumbnail track (W3C WebVTT; cue text = image URL with a W3C Media Fragments
// `#xywh=x,y,w,h` box) into cues the hover preview can look up. URLs resolve against the track's own
// URL, as a browser resolves them, so a relative "sprite.jpg" goes through the same media route.

export type ThumbnailCue = { startMs: number; endMs: number; url: string; x: number; y: number; w: number; h: number };

// hours optional (W3C WebVTT timestamp), exactly three fraction digits
const TIMING = /^(?:(\d{2,}):)?([0-5]\d):([0-5]\d)\.(\d{3})\s+-->\s+(?:(\d{2,}):)?([0-5]\d):([0-5]\d)\.(\d{3})(?:\s|$)/;
const XYWH = /#xywh=(?:pixel:)?(\d+),(\d+),(\d+),(\d+)$/;

const ms = (h: string | undefined, m: string, s: string, f: string) => ((Number(h ?? 0) * 60 + Number(m)) * 60 + Number(s)) * 1000 + Number(f);

export function parseThumbnailVtt(text: string, trackUrl: string): ThumbnailCue[] {
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/);
  if (!/^WEBVTT(?:[ \t].*)?$/.test(lines[0] ?? "")) throw new Error("not a WebVTT file");
  const cues: ThumbnailCue[] = [];
  for (let i = 1; i < lines.length; i++) {
    const t = TIMING.exec(lines[i]);
    if (!t) continue;
    const payload = (lines[i + 1] ?? "").trim();
    const box = XYWH.exec(payload);
    if (!payload || !box) continue;
    const url = new URL(payload.slice(0, box.index), trackUrl).toString();
    cues.push({
      startMs: ms(t[1], t[2], t[3], t[4]),
      endMs: ms(t[5], t[6], t[7], t[8]),
      url,
      x: Number(box[1]),
      y: Number(box[2]),
      w: Number(box[3]),
      h: Number(box[4]),
    });
  }
  return cues;
}

/** The cue showing at `timeMs` (cues are in start order and touch; binary search). */
export function cueAt(cues: ThumbnailCue[], timeMs: number): ThumbnailCue | null {
  let lo = 0;
  let hi = cues.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = cues[mid];
    if (timeMs < c.startMs) hi = mid - 1;
    else if (timeMs >= c.endMs) lo = mid + 1;
    else return c;
  }
  // past the last cue's end (the very end of the recording): its last picture
  return cues.length && timeMs >= cues[cues.length - 1].endMs ? cues[cues.length - 1] : null;
}
