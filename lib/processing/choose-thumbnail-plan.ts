// Scrub-thumbnail density and tile size for a recording: a tile every few seconds (1 s for short
// clips, up to 10 s for long ones, about 100 tiles until the recording passes ~17 minutes), 160 px
// wide tiles keeping the display aspect, 10 per row.
import { planThumbnailSprite, type ThumbnailSpriteLayout, type ThumbnailSpriteRequest } from "@/lib/vtt/plan-thumbnail-sprite";

export const TILE_WIDTH = 160; // px
export const SPRITE_COLUMNS = 10;
const TARGET_TILES = 100;
const MAX_INTERVAL_SEC = 10;
const MAX_SPRITE_SIDE = 65_500; // px, as lib/vtt/plan-thumbnail-sprite.ts

export interface ThumbnailPlan {
  request: ThumbnailSpriteRequest;
  layout: ThumbnailSpriteLayout;
}

export function chooseThumbnailPlan(input: { durationSec: number; width: number; height: number; sampleAspect?: number }): ThumbnailPlan {
  const { durationSec } = input;
  const displayAspect = (input.width * (input.sampleAspect && input.sampleAspect > 0 ? input.sampleAspect : 1)) / input.height;
  // Even heights: JPEG 4:2:0 chroma halves the height.
  const tileHeight = Math.max(2, 2 * Math.round(TILE_WIDTH / displayAspect / 2));
  let interval = Math.min(MAX_INTERVAL_SEC, Math.max(1, Math.ceil(durationSec / TARGET_TILES)));
  // Very long recordings: widen the interval until the sprite fits in a JPEG.
  const maxTiles = Math.floor(MAX_SPRITE_SIDE / tileHeight) * SPRITE_COLUMNS;
  if (Math.ceil(durationSec / interval) > maxTiles) interval = Math.ceil(durationSec / maxTiles);
  const request: ThumbnailSpriteRequest = {
    durationSeconds: durationSec,
    intervalSeconds: interval,
    tileWidth: TILE_WIDTH,
    tileHeight,
    columns: SPRITE_COLUMNS,
  };
  return { request, layout: planThumbnailSprite(request) };
}
