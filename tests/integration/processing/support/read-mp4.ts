// Reads an MP4 with the npm mp4box parser (GPAC's MP4Box.js, ISO/IEC 14496-12/-15): independent of
// ffmpeg, so our renditions are checked by a second implementation of the format.
import { readFile } from "node:fs/promises";
import { createFile, MP4BoxBuffer } from "mp4box";

export interface Mp4VideoTrack {
  codec: string;
  width: number;
  height: number;
  samples: number;
  /** Media duration of the track, seconds (sum of sample durations / media timescale). */
  durationSec: number;
}

export async function readMp4(path: string): Promise<{ isProgressive: boolean; videoTracks: Mp4VideoTrack[]; audioTracks: number; brands: string[] }> {
  const bytes = await readFile(path);
  const ab = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  const file = createFile();
  type Movie = Parameters<NonNullable<typeof file.onReady>>[0];
  const got: { info: Movie | null; error: string | null } = { info: null, error: null };
  file.onReady = (i) => (got.info = i);
  file.onError = (_module: string, message: string) => (got.error = message);
  file.appendBuffer(MP4BoxBuffer.fromArrayBuffer(ab, 0));
  file.flush();
  const movie = got.info;
  if (!movie) throw new Error(`mp4box could not read ${path}: ${got.error ?? "no moov"}`);
  return {
    isProgressive: movie.isProgressive,
    brands: movie.brands,
    audioTracks: movie.audioTracks.length,
    videoTracks: movie.videoTracks.map((t) => ({
      codec: t.codec,
      width: t.video?.width ?? t.track_width,
      height: t.video?.height ?? t.track_height,
      samples: t.nb_samples,
      durationSec: t.samples_duration / t.timescale,
    })),
  };
}
