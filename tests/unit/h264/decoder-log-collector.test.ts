import { describe, expect, it } from "vitest";
import { DecoderLogCollector } from "@/lib/h264/ffmpeg-decode-errors";

// Lines captured from Debian ffprobe 5.1:
//   ffprobe -v quiet -threads 1 -f h264 -show_log 16 -show_packets -show_frames
//     -show_entries packet=pos:frame=pkt_pos,coded_picture_number:log=level,message -of compact FILE
// on x264 streams with bytes of one slice flipped (B-frames, so frames come out reordered) and with
// one access unit cut out.
const REORDERED_WITH_ERROR = `packet|pos=0
packet|pos=5189
frame|pkt_pos=0|coded_picture_number=0||side_data|side_data_type=H.26[45] User Data Unregistered SEI message

packet|pos=64751
frame|pkt_pos=58555|coded_picture_number=31|
packet|pos=67277
frame|pkt_pos=67277|coded_picture_number=35|
packet|pos=68858
frame|pkt_pos=68858|coded_picture_number=36|
packet|pos=70370
frame|pkt_pos=64751|coded_picture_number=34|log|level=16|message=[h264 @ 0x55b177275640] Reference 5 >= 4
log|level=16|message=[h264 @ 0x55b177275640] error while decoding MB 14 0, bytestream 2414

packet|pos=72970
frame|pkt_pos=72970|coded_picture_number=38|`;

const WITH_GAP = `packet|pos=83204
frame|pkt_pos=83204|coded_picture_number=42|
packet|pos=85242
frame|pkt_pos=85242|coded_picture_number=43|
packet|pos=87101
frame|pkt_pos=87101|coded_picture_number=44|
packet|pos=89185
frame|pkt_pos=89185|coded_picture_number=46|
packet|pos=91278
frame|pkt_pos=91278|coded_picture_number=47|`;

function collect(text: string) {
  const c = new DecoderLogCollector();
  for (const line of text.split("\n")) c.line(line);
  return c.report();
}

describe("DecoderLogCollector", () => {
  it("attributes errors to the packet being decoded, not to the reordered frame printed with them", () => {
    const report = collect(REORDERED_WITH_ERROR);
    expect(report.errors).toEqual([
      { packetPositions: [70370], messages: ["Reference 5 >= 4", "error while decoding MB 14 0, bytestream 2414"] },
    ]);
    expect(report.decodedFrames).toBe(6);
    expect(report.packetPositions).toEqual([0, 5189, 64751, 67277, 68858, 70370, 72970]);
    // 5189 and 70370 are still in the reorder buffer at the end of this excerpt
    expect(report.undecodedPacketPositions).toEqual([5189, 70370]);
  });

  it("reads holes in coded_picture_number as frames the decoder inferred for a frame_num gap", () => {
    const report = collect(WITH_GAP);
    expect(report.gaps).toEqual([{ packetPosition: 89185, missingPictures: 1 }]);
    expect(report.errors).toEqual([]);
  });

  it("unescapes the compact writer's backslash escapes", () => {
    const report = collect("packet|pos=10\nframe|pkt_pos=10|coded_picture_number=0|log|level=16|message=a\\|b\\\\c");
    expect(report.errors[0].messages).toEqual(["a|b\\c"]);
  });

  it("ignores messages above error level except error concealment reports", () => {
    const report = collect("packet|pos=10\nframe|pkt_pos=10|coded_picture_number=0|log|level=24|message=just a warning");
    expect(report.errors).toEqual([]);
    // captured from the same ffprobe command on a stream with one slice of a picture cut out
    const concealed = collect(
      "packet|pos=34793\nframe|pkt_pos=34793|coded_picture_number=20|log|level=32|message=[h264 @ 0x55d54d23d9c0] concealing 81 DC, 81 AC, 81 MV errors in P frame",
    );
    expect(concealed.errors).toEqual([{ packetPositions: [34793], messages: ["concealing 81 DC, 81 AC, 81 MV errors in P frame"] }]);
  });
});
