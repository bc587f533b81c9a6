// Tool errors that describe the file's content become final, readable refusals. The stderr lines
// below were printed by Debian's ffmpeg/ffprobe 5.1 on this project's failure fixtures
// (tests/integration/processing/failures.test.ts) and on an audio-only MP4 mapped with -map 0:v:0.
import { describe, expect, it } from "vitest";
import { refusalFromToolError, RecordingRefused } from "@/lib/recordings/recording-refused";

describe("refusalFromToolError", () => {
  it.each([
    ["[mov,mp4,m4a,3gp,3g2,mj2 @ 0x56143952d180] moov atom not found\n/x: Invalid data found when processing input", /truncated/],
    ["/data/abc: Invalid data found when processing input", /not a video format/],
    ["Output file #0 does not contain any stream", /No video track/],
    ["Stream map '0:v:0' matches no streams.\nTo ignore this, add a trailing '?' to the map.", /No video track/],
  ])("%s", (stderr, reason) => {
    const r = refusalFromToolError(stderr);
    expect(r).toBeInstanceOf(RecordingRefused);
    expect(r!.message).toMatch(reason);
  });

  it("leaves machine problems to a retry", () => {
    expect(refusalFromToolError("No space left on device")).toBeNull();
    expect(refusalFromToolError("ffmpeg was killed with signal SIGKILL")).toBeNull();
  });
});
