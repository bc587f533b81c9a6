// Thumbnail density: a tile every few seconds. The sprite limit is libjpeg's JPEG_MAX_DIMENSION of
// 65,500 px (recalled from memory, as lib/vtt/plan-thumbnail-sprite.ts notes).
import { describe, expect, it } from "vitest";
import { chooseThumbnailPlan } from "@/lib/processing/choose-thumbnail-plan";

describe("chooseThumbnailPlan", () => {
  it.each([
    // duration s, interval s, tiles
    [3, 1, 3],
    [60, 1, 60],
    [600, 6, 100],
    [3600, 10, 360],
  ])("%i s -> a tile every %i s, %i tiles", (duration, interval, tiles) => {
    const { layout } = chooseThumbnailPlan({ durationSec: duration, width: 432, height: 240 });
    expect(layout.intervalMs).toBe(interval * 1000);
    expect(layout.tileCount).toBe(tiles);
  });

  it("keeps the display aspect in 160 px wide tiles with an even height", () => {
    expect(chooseThumbnailPlan({ durationSec: 10, width: 1920, height: 1080 }).layout).toMatchObject({ tileWidth: 160, tileHeight: 90 });
    // 432x240 is 1.8:1 -> 88.9 -> 88 (even)
    expect(chooseThumbnailPlan({ durationSec: 10, width: 432, height: 240 }).layout.tileHeight).toBe(88);
    // anamorphic 720x576 with 16:11 sample aspect -> 1047x576 display -> 88 px
    expect(chooseThumbnailPlan({ durationSec: 10, width: 720, height: 576, sampleAspect: 16 / 11 }).layout.tileHeight).toBe(88);
  });

  it("widens the interval for very long recordings so the sprite stays under 65,500 px", () => {
    const { layout } = chooseThumbnailPlan({ durationSec: 400 * 3600, width: 432, height: 240 });
    expect(layout.spriteHeight).toBeLessThanOrEqual(65_500);
    expect(layout.intervalMs).toBeGreaterThan(10_000);
  });
});
