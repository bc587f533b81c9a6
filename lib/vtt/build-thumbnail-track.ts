// WebVTT scrub-thumbnail track (W3C WebVTT): one cue per sprite tile, whose text is the sprite's
// URL with a W3C Media Fragments spatial fragment `#xywh=x,y,w,h` (pixels, the default unit)
// naming the tile. Players that support thumbnail tracks read the cue under the pointer and crop.
//
// Invariants a player relies on, all held here by construction in integer milliseconds:
// cues in start order, every end after its start, consecutive cues touching (no gap, no overlap),
// the first starting at 0 and the last ending exactly at the recording's duration.
import { formatVttTimestampMs } from "./format-vtt-timestamp";
import { planThumbnailSprite, tileBox, tileSpanMs, type ThumbnailSpriteRequest, type TileBox } from "./plan-thumbnail-sprite";

export interface ThumbnailTrackRequest extends ThumbnailSpriteRequest {
  /** sprite URL relative to the .vtt file (e.g. "sprite.jpg"); path segments are percent-encoded here */
  readonly spriteFileName: string;
}

/** `#xywh=x,y,w,h`: W3C Media Fragments URI 1.0 spatial dimension, pixel unit (the default). */
export function formatXywhFragment(box: TileBox): string {
  return `#xywh=${box.x},${box.y},${box.w},${box.h}`;
}

// Percent-encode each path segment so a space, "#" or "?" in a file name cannot end the path
// early and be read as a fragment or query, and a cue line can never contain "-->".
function encodeSpritePath(path: string): string {
  if (path === "" || /[\u0000-\u001f\u007f]/.test(path)) throw new RangeError(`unusable sprite file name ${JSON.stringify(path)}`);
  return path.split("/").map(encodeURIComponent).join("/");
}

export function buildThumbnailTrack(request: ThumbnailTrackRequest): string {
  const layout = planThumbnailSprite(request);
  const sprite = encodeSpritePath(request.spriteFileName);
  const lines = ["WEBVTT", ""];
  for (let i = 0; i < layout.tileCount; i++) {
    const { startMs, endMs } = tileSpanMs(layout, i);
    lines.push(`${formatVttTimestampMs(startMs)} --> ${formatVttTimestampMs(endMs)}`);
    lines.push(`${sprite}${formatXywhFragment(tileBox(layout, i))}`);
    lines.push("");
  }
  return lines.join("\n");
}
