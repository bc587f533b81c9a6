// Which rate a raw stream plays at: the pilot's override, else the SPS VUI timing, else the
// organisation's default. The NTSC-family rate 29.97 is 30000/1001 exactly (SMPTE ST 12-1; ffmpeg's
// own "ntsc" rate abbreviation is 30000/1001, ffmpeg-utils(1) "Video rate").
import { describe, expect, it } from "vitest";
import { chooseFrameRate, formatRateForFfmpeg } from "@/lib/processing/choose-frame-rate";

describe("chooseFrameRate", () => {
  it.each([
    [{ override: 25, streamFps: 30, organisationDefault: 60 }, { fps: 25, source: "recording-override" }],
    [{ override: null, streamFps: 50, organisationDefault: 30 }, { fps: 50, source: "stream" }],
    [{ override: null, streamFps: null, organisationDefault: 60 }, { fps: 60, source: "organisation-default" }],
    [{ override: undefined, streamFps: undefined, organisationDefault: 30 }, { fps: 30, source: "organisation-default" }],
    // implausible VUI timing (some encoders write 1000+ "ticks") is not trusted
    [{ override: null, streamFps: 1000, organisationDefault: 30 }, { fps: 30, source: "organisation-default" }],
    [{ override: 0, streamFps: 24, organisationDefault: 30 }, { fps: 24, source: "stream" }],
    [{ override: null, streamFps: Number.NaN, organisationDefault: 0 }, { fps: 30, source: "organisation-default" }],
  ])("%j -> %j", (input, expected) => {
    expect(chooseFrameRate(input)).toEqual(expected);
  });
});

describe("formatRateForFfmpeg", () => {
  it.each([
    [30, "30"],
    [25, "25"],
    [29.97, "30000/1001"],
    [30000 / 1001, "30000/1001"],
    [59.94, "60000/1001"],
    [23.976, "24000/1001"],
    [12.5, "12.5"],
  ])("%f -> %s", (fps, text) => {
    expect(formatRateForFfmpeg(fps)).toBe(text);
  });
});
