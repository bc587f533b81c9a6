// The poster still: one JPEG frame near the start (1 s in, where a recorder's first frames are often
// grey before the first full picture), square pixels, at most 1280 px wide.
import path from "node:path";
import { runFfmpeg } from "./ffmpeg";

export const POSTER_FILE = "poster.jpg";
export const POSTER_MAX_WIDTH = 1280; // px

export function posterTimeSec(durationSec: number): number {
  return durationSec > 2 ? 1 : 0;
}

export async function makePoster(opts: {
  sourcePath: string;
  sourceName: string;
  outDir: string;
  atSec: number;
  signal?: AbortSignal;
}): Promise<{ path: string; args: string[] }> {
  const out = path.join(opts.outDir, POSTER_FILE);
  const seek = opts.atSec > 0 ? ["-ss", opts.atSec.toFixed(3)] : [];
  const run = await runFfmpeg({
    label: "poster",
    input: { source: opts.sourcePath, name: opts.sourceName, options: seek },
    output: {
      path: out,
      name: POSTER_FILE,
      options: [
        "-an",
        "-vf", `scale=trunc(iw*sar/2)*2:ih,setsar=1,scale='min(${POSTER_MAX_WIDTH},iw)':-2`,
        "-frames:v", "1", "-q:v", "3", "-flags:v", "+bitexact", "-fflags", "+bitexact", "-f", "image2",
      ],
    },
    signal: opts.signal,
  });
  return { path: out, args: run.args };
}
