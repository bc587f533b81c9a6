// A WebVTT thumbnail track names its sprite by a path relative to the .vtt file. Served through a
// share link, that relative path would resolve to nothing (the sprite has its own signed address),
// so each cue's sprite reference is replaced by the signed sprite address, keeping the
// `#xywh=` Media Fragments part (W3C Media Fragments URI 1.0) and every timing line untouched.
const TIMING = /-->/;

export function rewriteThumbnailTrack(vtt: string, spriteUrl: string): string {
  if (/[\s#]/.test(spriteUrl)) throw new RangeError("sprite address must not contain spaces or '#'");
  return vtt
    .split(/\r\n|\r|\n/)
    .map((line) => {
      if (TIMING.test(line)) return line;
      const hash = line.indexOf("#xywh=");
      return hash > 0 ? spriteUrl + line.slice(hash) : line;
    })
    .join("\n");
}
