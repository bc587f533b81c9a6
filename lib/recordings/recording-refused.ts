// A recording whose content cannot be processed: retrying will not change the answer. The worker
// ends such a job at once (no retries) with this message as the recording's failure reason, which
// is shown to people as is: write it for a pilot, not for a developer.
export class RecordingRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RecordingRefused";
  }
}

// ffmpeg/ffprobe messages that describe the file's content rather than the machine's state.
const CONTENT_PROBLEMS: Array<[RegExp, string]> = [
  [/moov atom not found/i, "The file is incomplete or truncated: its index (the MP4 'moov' box) is missing"],
  [/Invalid data found when processing input/i, "The file is not a video format ffmpeg can read"],
  [/could not find codec parameters/i, "The video stream cannot be decoded: its codec parameters are missing"],
  [/does not contain any stream|Stream map '0:v:0' matches no streams/i, "No video track could be read from the file"],
  [/Invalid NAL unit size|no frame!|non-existing PPS|decode_slice_header error/i, "The video stream is damaged beyond decoding"],
  [/Unsupported codec|unknown codec|Decoder \(codec .*\) not found/i, "The video codec is not supported"],
];

/** A readable refusal when a tool's error is about the file's content, else null (a retry may help). */
export function refusalFromToolError(stderrOrMessage: string): RecordingRefused | null {
  for (const [pattern, reason] of CONTENT_PROBLEMS) {
    if (pattern.test(stderrOrMessage)) return new RecordingRefused(reason);
  }
  return null;
}
