import { describe, expect, it } from "vitest";
import webvtt from "webvtt-parser";
import { buildThumbnailTrack } from "@/lib/vtt/build-thumbnail-track";
import { rewriteThumbnailTrack } from "@/lib/sharing/rewrite-thumbnail-track";

// Independent reader: W3C's webvtt.js parser (npm webvtt-parser) implements the W3C WebVTT
// parsing algorithm and reports deviations as errors.
const parse = (text: string) => new webvtt.WebVTTParser().parse(text, "metadata");

describe("thumbnail track behind a share link", () => {
  const original = buildThumbnailTrack({ durationSeconds: 7.5, intervalSeconds: 1, tileWidth: 160, tileHeight: 90, columns: 5, spriteFileName: "sprite.jpg" });
  const signed = "/api/s/media/eyJsIjoiYWJjIn0.c2lnbmF0dXJlLXNpZ25hdHVyZS1zaWduYXR1cmUtc2lnbmF0dXJlMTI";

  it("keeps every cue and timing, and points each cue at the signed sprite with its xywh fragment", () => {
    const before = parse(original);
    const after = parse(rewriteThumbnailTrack(original, signed));
    expect(before.errors).toEqual([]);
    expect(after.errors).toEqual([]);
    expect(after.cues.length).toBe(before.cues.length);
    expect(after.cues.length).toBeGreaterThan(1);
    after.cues.forEach((cue, i) => {
      expect(cue.startTime).toBe(before.cues[i].startTime);
      expect(cue.endTime).toBe(before.cues[i].endTime);
      const fragment = before.cues[i].text.slice(before.cues[i].text.indexOf("#"));
      // W3C Media Fragments URI 1.0 spatial dimension, unchanged
      expect(fragment).toMatch(/^#xywh=\d+,\d+,\d+,\d+$/);
      expect(cue.text).toBe(signed + fragment);
    });
  });

  it("refuses an address that could break a cue line", () => {
    expect(() => rewriteThumbnailTrack(original, "/a b")).toThrow();
    expect(() => rewriteThumbnailTrack(original, "/a#b")).toThrow();
  });
});
