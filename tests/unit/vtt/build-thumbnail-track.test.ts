import { describe, expect, it } from "vitest";
import webvtt from "webvtt-parser";
import { buildThumbnailTrack, formatXywhFragment } from "@/lib/vtt/build-thumbnail-track";
import { planThumbnailSprite, type ThumbnailSpriteRequest } from "@/lib/vtt/plan-thumbnail-sprite";
import { formatVttTimestamp, formatVttTimestampMs } from "@/lib/vtt/format-vtt-timestamp";

// Independent reader: W3C's webvtt.js parser and validator (npm webvtt-parser), which implements
// the W3C WebVTT parsing algorithm and reports every deviation from the syntax as an error.
function parseVtt(text: string) {
  return new webvtt.WebVTTParser().parse(text, "metadata");
}

// Spatial fragment grammar of W3C Media Fragments URI 1.0: xywh=[pixel:]x,y,w,h with non-negative
// integers and w, h > 0 (pixel is the default unit).
const XYWH = /^#xywh=(?:pixel:)?(\d+),(\d+),(\d+),(\d+)$/;

function checkTrack(request: ThumbnailSpriteRequest & { spriteFileName: string }) {
  const layout = planThumbnailSprite(request);
  const text = buildThumbnailTrack(request);
  const { cues, errors } = parseVtt(text);
  expect(errors).toEqual([]);
  expect(text.startsWith("WEBVTT\n")).toBe(true);
  expect(cues).toHaveLength(layout.tileCount);

  // Cue timing lines: exactly three fraction digits on both sides (W3C WebVTT timestamp).
  for (const line of text.split("\n").filter((l) => l.includes("-->"))) {
    expect(line).toMatch(/^\d{2,}:\d{2}:\d{2}\.\d{3} --> \d{2,}:\d{2}:\d{2}\.\d{3}$/);
  }

  const durationMs = Math.round(request.durationSeconds * 1000);
  expect(Math.round(cues[0].startTime * 1000)).toBe(0);
  expect(Math.round(cues[cues.length - 1].endTime * 1000)).toBe(durationMs);
  const seenBoxes = new Set<string>();
  cues.forEach((cue, i) => {
    expect(cue.endTime).toBeGreaterThan(cue.startTime);
    if (i > 0) {
      expect(cue.startTime).toBeGreaterThan(cues[i - 1].startTime);
      // consecutive cues touch: the strip has no hole where scrubbing shows nothing
      expect(Math.round(cue.startTime * 1000)).toBe(Math.round(cues[i - 1].endTime * 1000));
    }
    // WHATWG URL parser (Node's URL) splits the cue text into sprite path and fragment.
    const url = new URL(cue.text, "https://media.invalid/r/track.vtt");
    expect(decodeURIComponent(url.pathname)).toBe(`/r/${request.spriteFileName}`);
    const box = XYWH.exec(url.hash);
    expect(box, cue.text).not.toBeNull();
    const [x, y, w, h] = box!.slice(1).map(Number);
    expect(w).toBe(request.tileWidth);
    expect(h).toBe(request.tileHeight);
    expect(x + w).toBeLessThanOrEqual(layout.spriteWidth);
    expect(y + h).toBeLessThanOrEqual(layout.spriteHeight);
    seenBoxes.add(`${x},${y}`);
  });
  expect(seenBoxes.size).toBe(layout.tileCount); // no two cues share a tile
  return { layout, cues, text };
}

describe("buildThumbnailTrack (W3C WebVTT + Media Fragments)", () => {
  it("a 95.5 s recording at 2 s tiles, 10 columns", () => {
    const { layout, cues } = checkTrack({
      durationSeconds: 95.5, intervalSeconds: 2, tileWidth: 160, tileHeight: 90, columns: 10, spriteFileName: "sprite.jpg",
    });
    expect(layout).toMatchObject({ tileCount: 48, columns: 10, rows: 5, spriteWidth: 1600, spriteHeight: 450 });
    expect(cues[47].text).toBe("sprite.jpg#xywh=1120,360,160,90");
    expect(cues[47].startTime).toBe(94);
    expect(cues[47].endTime).toBe(95.5);
  });

  it("writes exactly the expected text for a tiny case", () => {
    expect(buildThumbnailTrack({ durationSeconds: 2.5, intervalSeconds: 1, tileWidth: 8, tileHeight: 6, columns: 2, spriteFileName: "s.jpg" })).toBe(
      [
        "WEBVTT",
        "",
        "00:00:00.000 --> 00:00:01.000",
        "s.jpg#xywh=0,0,8,6",
        "",
        "00:00:01.000 --> 00:00:02.000",
        "s.jpg#xywh=8,0,8,6",
        "",
        "00:00:02.000 --> 00:00:02.500",
        "s.jpg#xywh=0,6,8,6",
        "",
      ].join("\n"),
    );
  });

  it.each([
    [0.001, 1, 4],
    [0.999, 1, 4],
    [1, 1, 4],
    [2.1, 0.3, 4], // floating-point 2.1 / 0.3 is just above 7; there must be 7 tiles, not 8
    [59.94, 0.5, 7],
    [3600.033, 5, 12],
    [7 * 3600 + 0.4, 30, 20],
    [10.0004, 1, 3], // rounds to 10.000 s: the last cue must not be empty
  ])("duration %f s, interval %f s, %i columns", (durationSeconds, intervalSeconds, columns) => {
    const { layout } = checkTrack({ durationSeconds, intervalSeconds, tileWidth: 120, tileHeight: 68, columns, spriteFileName: "thumbs.jpg" });
    expect(layout.tileCount).toBe(Math.ceil(Math.round(durationSeconds * 1000) / Math.round(intervalSeconds * 1000)));
  });

  it("a file name with spaces, '#' and non-ASCII still yields one path and one fragment", () => {
    checkTrack({ durationSeconds: 12, intervalSeconds: 5, tileWidth: 64, tileHeight: 36, columns: 4, spriteFileName: "thumbs/pier #2 süd.jpg" });
  });

  it("fewer tiles than columns: the sprite is one row of exactly tileCount tiles", () => {
    expect(planThumbnailSprite({ durationSeconds: 3, intervalSeconds: 1, tileWidth: 100, tileHeight: 50, columns: 10 })).toMatchObject({
      tileCount: 3, columns: 3, rows: 1, spriteWidth: 300, spriteHeight: 50,
    });
  });

  it("refuses impossible requests", () => {
    const base = { durationSeconds: 10, intervalSeconds: 1, tileWidth: 160, tileHeight: 90, columns: 10 };
    expect(() => planThumbnailSprite({ ...base, durationSeconds: 0 })).toThrow(RangeError);
    expect(() => planThumbnailSprite({ ...base, durationSeconds: 0.0004 })).toThrow(RangeError);
    expect(() => planThumbnailSprite({ ...base, intervalSeconds: -1 })).toThrow(RangeError);
    expect(() => planThumbnailSprite({ ...base, tileWidth: 1.5 })).toThrow(RangeError);
    expect(() => planThumbnailSprite({ ...base, columns: 0 })).toThrow(RangeError);
    // 10 h at 1 s into 10 columns of 90 px: 3600 rows, 324,000 px high: beyond any JPEG
    expect(() => planThumbnailSprite({ ...base, durationSeconds: 36_000 })).toThrow(/exceeds/);
    expect(() => buildThumbnailTrack({ ...base, spriteFileName: "" })).toThrow(RangeError);
  });

  it("formats a Media Fragments box", () => {
    expect(formatXywhFragment({ x: 160, y: 90, w: 160, h: 90 })).toBe("#xywh=160,90,160,90");
  });
});

describe("formatVttTimestamp (W3C WebVTT timestamp)", () => {
  it("writes hh:mm:ss.ttt that the W3C parser reads back", () => {
    for (const seconds of [0, 0.001, 1.5, 59.999, 60, 3599.9994, 3600, 86_399.999, 400_000.25]) {
      const stamp = formatVttTimestamp(seconds);
      expect(stamp).toMatch(/^\d{2,}:\d{2}:\d{2}\.\d{3}$/);
      const { cues, errors } = parseVtt(`WEBVTT\n\n${stamp} --> ${formatVttTimestamp(seconds + 1)}\nx\n`);
      expect(errors).toEqual([]);
      expect(cues[0].startTime).toBeCloseTo(Math.round(seconds * 1000) / 1000, 9);
    }
    expect(formatVttTimestampMs(3_723_004)).toBe("01:02:03.004");
  });
});
