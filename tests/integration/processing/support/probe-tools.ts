// ffprobe run directly (not through our wrapper) as the reference for frame counts and image sizes.
import { runTool } from "@/tests/support/media/make-h264";

/** Decodable frames of a file by ffprobe -count_frames (nb_read_frames of the first video stream). */
export async function ffprobeFrameCount(file: string, rawH264 = false): Promise<number> {
  const { stdout } = await runTool("ffprobe", [
    "-v", "error",
    ...(rawH264 ? ["-f", "h264"] : []),
    "-count_frames", "-select_streams", "v:0",
    "-show_entries", "stream=nb_read_frames", "-of", "csv=p=0", file,
  ]);
  return Number(stdout.trim().split("\n")[0]);
}

export async function ffprobeSize(file: string): Promise<{ width: number; height: number; codec: string }> {
  const { stdout } = await runTool("ffprobe", [
    "-v", "error", "-select_streams", "v:0", "-show_entries", "stream=width,height,codec_name", "-of", "json", file,
  ]);
  const s = JSON.parse(stdout).streams[0];
  return { width: s.width, height: s.height, codec: s.codec_name };
}
