export type TimecodeErrorCode =
  | "malformed" // not HH:MM:SS:FF / HH:MM:SS;FF
  | "out-of-range" // a field past its limit, or a frame beyond 24 h
  | "dropped-label" // a drop-frame label that the counting skips (00:02:00;00 at 29.97)
  | "unsupported-rate"; // no SMPTE counting defined for this rate / mode

export class TimecodeError extends Error {
  constructor(
    readonly code: TimecodeErrorCode,
    message: string,
  ) {
    super(message);
    this.name = "TimecodeError";
  }
}
