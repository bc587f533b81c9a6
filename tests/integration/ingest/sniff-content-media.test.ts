// Content check by bytes, against files made by Debian's ffmpeg and identified independently by
// ffprobe (its demuxer probing, `-show_format`): what ffprobe calls raw H.264, MP4, MOV or JPEG is
// accepted as that kind; PNG, raw H.265, MPEG-TS and Matroska are refused and named.
import { readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { sniffContent } from "@/lib/uploads/sniff-content";
import { SNIFF_BYTES } from "@/lib/uploads/upload-limits";
import { MEDIA_CACHE_DIR, makeJpeg, makeMov, makeMp4, makePng, makeRawH264, makeRawHevc, runTool } from "@/tests/support/media/make-upload-fixtures";

type Probe = { formatName: string; majorBrand?: string; codec?: string };

async function ffprobe(file: string): Promise<Probe> {
  const { stdout } = await runTool("ffprobe", ["-v", "error", "-show_entries", "format=format_name:format_tags=major_brand:stream=codec_name", "-of", "json", file]);
  const j = JSON.parse(stdout);
  return { formatName: j.format.format_name, majorBrand: j.format.tags?.major_brand, codec: j.streams?.[0]?.codec_name };
}

const head = async (file: string) => (await readFile(file)).subarray(0, SNIFF_BYTES);
const whole = async (file: string) => {
  const b = await readFile(file);
  return { bytes: b.subarray(0, SNIFF_BYTES), complete: b.length <= SNIFF_BYTES };
};

async function ffmpegFile(name: string, args: string[]): Promise<string> {
  const out = path.join(MEDIA_CACHE_DIR, name);
  await runTool("ffmpeg", ["-v", "error", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x180:rate=25", "-t", "1", ...args, out]);
  return out;
}

describe("files that are accepted, as ffprobe identifies them", () => {
  let files: Record<string, string>;
  beforeAll(async () => {
    files = {
      raw: await makeRawH264({ seconds: 2 }),
      // an access unit delimiter (type 9) before the SPS, as some recorders write
      rawAud: await makeRawH264({ seconds: 1, bsf: "h264_metadata=aud=insert" }),
      mp4: await makeMp4(),
      mov: await makeMov(),
      jpeg: await makeJpeg(),
    };
  });

  it("raw H.264 Annex B: ffprobe's h264 demuxer and our check agree", async () => {
    for (const f of [files.raw, files.rawAud]) {
      expect((await ffprobe(f)).formatName).toBe("h264");
      const { bytes, complete } = await whole(f);
      expect(sniffContent(bytes, complete)).toEqual({ ok: true, kind: "raw_h264" });
    }
  });

  it("a stream cut mid-GOP (starts with a non-IDR slice, SPS at the next keyframe) is still raw H.264", async () => {
    const full = await readFile(await makeRawH264({ seconds: 2, gop: 15 }));
    // first start code of a non-IDR slice (nal_unit_type 1, Table 7-1)
    let cut = -1;
    for (let i = 0; i + 3 < full.length; i++) {
      if (full[i] === 0 && full[i + 1] === 0 && full[i + 2] === 1 && (full[i + 3] & 0x1f) === 1) {
        cut = i;
        break;
      }
    }
    expect(cut).toBeGreaterThan(0);
    const midGop = path.join(MEDIA_CACHE_DIR, "mid-gop.264");
    await writeFile(midGop, full.subarray(cut));
    expect((await ffprobe(midGop)).formatName).toBe("h264");
    expect(sniffContent(full.subarray(cut), true)).toEqual({ ok: true, kind: "raw_h264" });
  });

  it("MP4 and MOV: ffprobe's major_brand decides mp4 vs mov the same way", async () => {
    const mp4 = await ffprobe(files.mp4);
    const mov = await ffprobe(files.mov);
    expect(mp4.formatName).toContain("mp4");
    expect(mp4.majorBrand).toBe("isom");
    expect(mov.majorBrand).toBe("qt  ");
    expect(sniffContent(await head(files.mp4), false)).toEqual({ ok: true, kind: "mp4" });
    expect(sniffContent(await head(files.mov), false)).toEqual({ ok: true, kind: "mov" });
  });

  it("JPEG: ffprobe sees an mjpeg image", async () => {
    expect((await ffprobe(files.jpeg)).codec).toBe("mjpeg");
    expect(sniffContent(await head(files.jpeg), true)).toEqual({ ok: true, kind: "jpeg" });
  });
});

describe("media files that are refused, with a reason", () => {
  it("a PNG (whatever its name) is named as a PNG", async () => {
    const png = await makePng();
    expect((await ffprobe(png)).codec).toBe("png");
    const r = sniffContent(await head(png), true);
    expect(r).toEqual({ ok: false, reason: "it is a PNG image, not a recording" });
  });

  it("a raw H.265 stream is told apart from raw H.264", async () => {
    const hevc = await makeRawHevc();
    expect((await ffprobe(hevc)).formatName).toBe("hevc");
    const r = sniffContent(await head(hevc), true);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/H\.265/);
  });

  it("MPEG transport stream and Matroska made by ffmpeg are refused and named", async () => {
    const ts = await ffmpegFile("upload-fixture.ts", ["-c:v", "libx264", "-f", "mpegts"]);
    const mkv = await ffmpegFile("upload-fixture.mkv", ["-c:v", "libx264", "-f", "matroska"]);
    expect((await ffprobe(ts)).formatName).toBe("mpegts");
    expect((await ffprobe(mkv)).formatName).toContain("matroska");
    expect(sniffContent(await head(ts), true)).toEqual({ ok: false, reason: "it is an MPEG transport stream, not a recording" });
    expect(sniffContent(await head(mkv), true)).toEqual({ ok: false, reason: "it is a Matroska/WebM file, not a recording" });
  });
});
