// The scrub-thumbnail sprite (JPEG) and its WebVTT track. Two ffmpeg runs: the first picks one frame
// per interval and scales it into a numbered tile (its time= follows the input, so progress is
// real); the second lays the tiles out row by row with the tile filter, exactly as
// lib/vtt/plan-thumbnail-sprite.ts plans them, so every cue's #xywh box matches a tile.
import "server-only";
import { mkdir, readdir, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { buildThumbnailTrack } from "@/lib/vtt/build-thumbnail-track";
import { runFfmpeg } from "./ffmpeg";
import type { ThumbnailPlan } from "./choose-thumbnail-plan";

export const SPRITE_FILE = "sprite.jpg";
export const THUMBNAILS_FILE = "thumbnails.vtt";

export interface ThumbnailTrackResult {
  spritePath: string;
  vttPath: string;
  spriteArgs: string[];
  tileArgs: string[];
}

export async function makeThumbnailTrack(opts: {
  playablePath: string;
  outDir: string;
  plan: ThumbnailPlan;
  signal?: AbortSignal;
  onProgress?: (percent: number) => void;
}): Promise<ThumbnailTrackResult> {
  const { layout, request } = opts.plan;
  const tilesDir = path.join(opts.outDir, ".tiles");
  await rm(tilesDir, { recursive: true, force: true });
  await mkdir(tilesDir, { recursive: true });
  try {
    const interval = layout.intervalMs / 1000;
    const pick = await runFfmpeg({
      label: "thumbnail tiles",
      input: { source: opts.playablePath, name: "playable.mp4", options: ["-an"] },
      output: {
        path: path.join(tilesDir, "%06d.bmp"),
        name: "tiles/%06d.bmp",
        // fps=1/interval keeps the frame nearest each tile's start time; BMP tiles cost no encoding.
        options: [
          "-vf", `fps=fps=1/${interval},scale=${layout.tileWidth}:${layout.tileHeight},setsar=1`,
          "-frames:v", String(layout.tileCount),
          "-c:v", "bmp", "-f", "image2",
        ],
      },
      signal: opts.signal,
      expectedDurationSec: layout.durationMs / 1000,
      onProgress: (p) => opts.onProgress?.(p * 0.9),
    });
    const picked = (await readdir(tilesDir)).filter((f) => f.endsWith(".bmp")).length;
    if (picked === 0) throw new Error("no thumbnail tile could be decoded from the playable video");
    const spritePath = path.join(opts.outDir, SPRITE_FILE);
    const sprite = await runFfmpeg({
      label: "thumbnail sprite",
      input: { source: path.join(tilesDir, "%06d.bmp"), name: "tiles/%06d.bmp", options: ["-framerate", "1", "-f", "image2"] },
      output: {
        path: spritePath,
        name: SPRITE_FILE,
        // A short last row is padded (black) by the tile filter at end of input.
        options: ["-vf", `tile=${layout.columns}x${layout.rows}`, "-frames:v", "1", "-q:v", "4", "-flags:v", "+bitexact", "-fflags", "+bitexact", "-f", "image2"],
      },
      signal: opts.signal,
    });
    const vttPath = path.join(opts.outDir, THUMBNAILS_FILE);
    await writeFile(vttPath, buildThumbnailTrack({ ...request, spriteFileName: SPRITE_FILE }), "utf8");
    opts.onProgress?.(100);
    return { spritePath, vttPath, spriteArgs: pick.args, tileArgs: sprite.args };
  } finally {
    await rm(tilesDir, { recursive: true, force: true });
  }
}
