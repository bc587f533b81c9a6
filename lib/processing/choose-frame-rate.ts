// Which frame rate a raw H.264 recording plays at. Raw Annex B streams carry no timestamps; the SPS VUI
// timing info says the rate when the encoder wrote it, and often it did not. Precedence: the pilot's
// per-recording override, then the stream's own statement, then the organisation's default for
// controller recordings.
import type { ProbeFacts } from "@/db/schema/media";

export const MIN_FPS = 1;
export const MAX_FPS = 240;

export type FpsSource = NonNullable<ProbeFacts["fpsSource"]>;

function usable(fps: number | null | undefined): fps is number {
  return typeof fps === "number" && Number.isFinite(fps) && fps >= MIN_FPS && fps <= MAX_FPS;
}

export function chooseFrameRate(input: {
  override: number | null | undefined;
  streamFps: number | null | undefined;
  organisationDefault: number;
}): { fps: number; source: FpsSource } {
  if (usable(input.override)) return { fps: input.override, source: "recording-override" };
  // VUI timing of e.g. 1000 fps is written by some encoders as a "field rate" placeholder: not trusted.
  if (usable(input.streamFps)) return { fps: input.streamFps, source: "stream" };
  if (usable(input.organisationDefault)) return { fps: input.organisationDefault, source: "organisation-default" };
  return { fps: 30, source: "organisation-default" };
}

/** ffmpeg's -r takes a rational or a decimal; 29.97-style rates are written as their exact fraction. */
export function formatRateForFfmpeg(fps: number): string {
  const ntsc = [24, 30, 60, 120].find((base) => Math.abs(fps - (base * 1000) / 1001) < 0.005);
  if (ntsc) return `${ntsc * 1000}/1001`;
  return Number.isInteger(fps) ? String(fps) : String(Math.round(fps * 1000) / 1000);
}
