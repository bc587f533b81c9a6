// "of 360, 45 lost" / "of 360, at least 45 lost" / "of 360": the frame count beside a frame number.
// The count is of recorder frame slots, lost ones included; a lost count that is only a lower bound
// (the stream's structure could not tell how many went missing) says "at least".
export type LostFrames = { frames: number; isLowerBound: boolean } | null;

export function describeLost(lost: NonNullable<LostFrames>): string {
  return `${lost.isLowerBound ? "at least " : ""}${lost.frames} lost`;
}

export function describeFrameCount(frameCount: number, lost: LostFrames): string {
  const of = `of ${frameCount}`;
  return lost && (lost.frames > 0 || lost.isLowerBound) ? `${of}, ${describeLost(lost)}` : of;
}
