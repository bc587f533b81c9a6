// Layout of a scrub-thumbnail sprite: one tile per interval of the recording, filled row by row
// (left to right, top to bottom), as the worker's ffmpeg `tile` filter lays them out.
//
// Times are planned in whole milliseconds because WebVTT cue timings carry exactly three fraction
// digits: planning in the same unit means the cue boundaries written are the boundaries planned.

export interface ThumbnailSpriteRequest {
  readonly durationSeconds: number;
  readonly intervalSeconds: number;
  /** pixels */
  readonly tileWidth: number;
  /** pixels */
  readonly tileHeight: number;
  /** tiles per row at most */
  readonly columns: number;
  /** largest sprite side in pixels; default 65,500 (libjpeg's JPEG_MAX_DIMENSION, recalled from memory) */
  readonly maxSpriteSide?: number;
}

export interface ThumbnailSpriteLayout {
  readonly durationMs: number;
  readonly intervalMs: number;
  /** ceil(duration / interval) */
  readonly tileCount: number;
  /** tiles per row actually used: min(requested columns, tileCount) */
  readonly columns: number;
  readonly rows: number;
  readonly tileWidth: number;
  readonly tileHeight: number;
  readonly spriteWidth: number;
  readonly spriteHeight: number;
}

export interface TileBox {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

const DEFAULT_MAX_SPRITE_SIDE = 65_500;

function positiveInteger(name: string, value: number): void {
  if (!Number.isSafeInteger(value) || value <= 0) throw new RangeError(`${name} must be a positive integer, got ${value}`);
}

export function planThumbnailSprite(request: ThumbnailSpriteRequest): ThumbnailSpriteLayout {
  const { durationSeconds, intervalSeconds, tileWidth, tileHeight } = request;
  if (!Number.isFinite(durationSeconds) || durationSeconds <= 0) throw new RangeError(`duration must be positive seconds, got ${durationSeconds}`);
  if (!Number.isFinite(intervalSeconds) || intervalSeconds <= 0) throw new RangeError(`interval must be positive seconds, got ${intervalSeconds}`);
  positiveInteger("tile width", tileWidth);
  positiveInteger("tile height", tileHeight);
  positiveInteger("columns", request.columns);

  const durationMs = Math.round(durationSeconds * 1000);
  const intervalMs = Math.round(intervalSeconds * 1000);
  // A recording shorter than half a millisecond has no cue a WebVTT file can express.
  if (durationMs < 1) throw new RangeError(`duration ${durationSeconds} s rounds to 0 ms: nothing to thumbnail`);
  if (intervalMs < 1) throw new RangeError(`interval ${intervalSeconds} s rounds to 0 ms`);

  // Divide whole milliseconds: in floating point 2.1 / 0.3 is 7.000000000000001, whose ceiling
  // would add an empty eighth tile.
  const tileCount = Math.ceil(durationMs / intervalMs);
  const columns = Math.min(request.columns, tileCount);
  const rows = Math.ceil(tileCount / columns);
  const spriteWidth = columns * tileWidth;
  const spriteHeight = rows * tileHeight;

  const maxSide = request.maxSpriteSide ?? DEFAULT_MAX_SPRITE_SIDE;
  if (spriteWidth > maxSide || spriteHeight > maxSide) {
    throw new RangeError(
      `sprite of ${spriteWidth}x${spriteHeight} px exceeds ${maxSide} px: choose a longer interval, smaller tiles or more columns`,
    );
  }
  return { durationMs, intervalMs, tileCount, columns, rows, tileWidth, tileHeight, spriteWidth, spriteHeight };
}

/** Pixel box of tile `index` inside the sprite. */
export function tileBox(layout: ThumbnailSpriteLayout, index: number): TileBox {
  if (!Number.isSafeInteger(index) || index < 0 || index >= layout.tileCount) {
    throw new RangeError(`tile ${index} is outside 0..${layout.tileCount - 1}`);
  }
  return {
    x: (index % layout.columns) * layout.tileWidth,
    y: Math.floor(index / layout.columns) * layout.tileHeight,
    w: layout.tileWidth,
    h: layout.tileHeight,
  };
}

/** [start, end) of tile `index` in ms; the last tile ends exactly at the duration. */
export function tileSpanMs(layout: ThumbnailSpriteLayout, index: number): { startMs: number; endMs: number } {
  if (!Number.isSafeInteger(index) || index < 0 || index >= layout.tileCount) {
    throw new RangeError(`tile ${index} is outside 0..${layout.tileCount - 1}`);
  }
  const startMs = index * layout.intervalMs;
  return { startMs, endMs: Math.min(startMs + layout.intervalMs, layout.durationMs) };
}
