// Trace intervals on the recorder's clock (lost frames count) mapped onto the playable's clock
// (present frames only, from the first IDR). Worked by hand at 30 fps.
import { describe, expect, it } from "vitest";
import { mapTraceToPlayable } from "@/lib/processing/map-trace-to-playable";

const iv = (state: "intact" | "damaged" | "lost", startFrame: number, endFrame: number) => ({
  state,
  startFrame,
  endFrame,
  startSec: startFrame / 30,
  endSec: endFrame / 30,
});

describe("mapTraceToPlayable", () => {
  it("gives lost intervals no playable length and shifts what follows back", () => {
    const out = mapTraceToPlayable([iv("intact", 0, 40), iv("lost", 40, 43), iv("damaged", 43, 60), iv("intact", 60, 90)], 30);
    expect(out.map((o) => [o.state, o.frames, o.playableStartSec, o.playableEndSec])).toEqual([
      ["intact", 40, 0, 40 / 30],
      ["lost", 3, 40 / 30, 40 / 30],
      ["damaged", 17, 40 / 30, 57 / 30],
      ["intact", 30, 57 / 30, 87 / 30],
    ]);
  });

  it("maps frames before the playable's first frame to 0", () => {
    const out = mapTraceToPlayable([iv("damaged", 0, 25), iv("intact", 25, 85)], 30, 25);
    expect(out[0]).toMatchObject({ playableStartSec: 0, playableEndSec: 0 });
    expect(out[1]).toMatchObject({ playableStartSec: 0, playableEndSec: 2 });
  });
});
