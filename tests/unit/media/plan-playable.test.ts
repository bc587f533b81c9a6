// How the playable MP4 is made. Browser support (recalled from memory, MDN "Web video codec guide"):
// H.264 8-bit 4:2:0 progressive plays everywhere; High 10, 4:2:2, 4:4:4 and interlaced do not reliably.
import { describe, expect, it } from "vitest";
import { planContainerPlayable, planRawPlayable } from "@/lib/processing/plan-playable";

const clean = { chromaFormatIdc: 1, bitDepthLuma: 8, interlaced: false, startsWithIdr: true, firstIdrOffset: 0 };

describe("planRawPlayable", () => {
  it("remuxes a browser-ready stream with -f h264 -r <fps>, copy, faststart", () => {
    const p = planRawPlayable(clean, 30);
    expect(p.mode).toBe("remux");
    expect(p.startOffset).toBe(0);
    expect(p.inputOptions).toEqual(["-f", "h264", "-r", "30"]);
    expect(p.outputOptions).toEqual(expect.arrayContaining(["-c:v", "copy", "-movflags", "+faststart"]));
  });

  it("starts at the first IDR when the stream starts mid-GOP", () => {
    expect(planRawPlayable({ ...clean, startsWithIdr: false, firstIdrOffset: 48_213 }, 30).startOffset).toBe(48_213);
  });

  it("keeps a stream without any IDR whole (recovery points only)", () => {
    expect(planRawPlayable({ ...clean, startsWithIdr: false, firstIdrOffset: null }, 30).startOffset).toBe(0);
  });

  it.each([
    ["4:2:2", { chromaFormatIdc: 2 }],
    ["10-bit", { bitDepthLuma: 10 }],
    ["interlaced", { interlaced: true }],
  ])("transcodes %s to 8-bit 4:2:0 H.264", (_label, over) => {
    const p = planRawPlayable({ ...clean, ...over }, 25);
    expect(p.mode).toBe("transcode");
    expect(p.outputOptions).toEqual(expect.arrayContaining(["-c:v", "libx264", "-pix_fmt", "yuv420p"]));
    expect(p.inputOptions).toEqual(["-f", "h264", "-r", "25"]);
  });
});

describe("planContainerPlayable", () => {
  it("copies H.264 4:2:0 with AAC audio", () => {
    const p = planContainerPlayable({ videoCodec: "h264", pixFmt: "yuv420p", audioCodec: "aac" });
    expect(p.mode).toBe("remux");
    expect(p.outputOptions).toEqual(expect.arrayContaining(["-c:v", "copy", "-c:a", "copy", "-map", "0:a:0?"]));
  });

  it("transcodes H.265 and re-encodes audio browsers may not play", () => {
    const p = planContainerPlayable({ videoCodec: "hevc", pixFmt: "yuv420p10le", audioCodec: "pcm_s16le" });
    expect(p.mode).toBe("transcode");
    expect(p.outputOptions).toEqual(expect.arrayContaining(["-c:v", "libx264", "-c:a", "aac"]));
    expect(p.reason).toMatch(/hevc/);
  });

  it("leaves audio options out when there is no audio", () => {
    const p = planContainerPlayable({ videoCodec: "h264", pixFmt: "yuvj420p", audioCodec: null });
    expect(p.mode).toBe("remux");
    expect(p.outputOptions).not.toContain("-c:a");
  });
});
