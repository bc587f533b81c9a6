import { describe, expect, it } from "vitest";
import webvtt from "webvtt-parser";
import { buildThumbnailTrack } from "@/lib/vtt/build-thumbnail-track";
import { planThumbnailSprite, tileBox } from "@/lib/vtt/plan-thumbnail-sprite";
import { cueAt, parseThumbnailVtt } from "@/components/player/parse-thumbnail-vtt";

const TRACK_URL = "http://localhost:3249/api/media/recordings/abc/thumbnails.vtt";
const request = { durationSeconds: 10.5, intervalSeconds: 2, tileWidth: 160, tileHeight: 90, columns: 3, spriteFileName: "sprite.jpg" };

describe("parseThumbnailVtt", () => {
  const text = buildThumbnailTrack(request);
  const cues = parseThumbnailVtt(text, TRACK_URL);

  it("reads the same cue times as W3C's webvtt.js parser (npm webvtt-parser)", () => {
    const reference = new webvtt.WebVTTParser().parse(text, "metadata");
    expect(reference.errors).toEqual([]);
    expect(cues.map((c) => [c.startMs, c.endMs])).toEqual(reference.cues.map((c) => [Math.round(c.startTime * 1000), Math.round(c.endTime * 1000)]));
  });

  it("reads each tile box as planned, and resolves the sprite URL against the track (WHATWG URL)", () => {
    const layout = planThumbnailSprite(request);
    cues.forEach((c, i) => expect({ x: c.x, y: c.y, w: c.w, h: c.h }).toEqual(tileBox(layout, i)));
    expect(cues[0].url).toBe("http://localhost:3249/api/media/recordings/abc/sprite.jpg");
  });

  it("finds the cue on screen at a time, the last one at and past the end", () => {
    expect(cueAt(cues, 0)).toBe(cues[0]);
    expect(cueAt(cues, 1999)).toBe(cues[0]);
    expect(cueAt(cues, 2000)).toBe(cues[1]);
    expect(cueAt(cues, 10_500)).toBe(cues[cues.length - 1]);
    expect(cueAt([], 5)).toBeNull();
  });

  it("accepts hour-less timestamps (W3C WebVTT) and refuses a file that is not WebVTT", () => {
    const short = parseThumbnailVtt("WEBVTT\n\n00:01.000 --> 00:02.500\nimg/s.jpg#xywh=10,20,30,40\n", TRACK_URL);
    expect(short).toEqual([{ startMs: 1000, endMs: 2500, url: "http://localhost:3249/api/media/recordings/abc/img/s.jpg", x: 10, y: 20, w: 30, h: 40 }]);
    expect(() => parseThumbnailVtt("<html>", TRACK_URL)).toThrow();
  });
});
