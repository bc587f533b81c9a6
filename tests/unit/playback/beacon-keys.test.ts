import { describe, expect, it } from "vitest";
import { BEACON_FIELDS, beaconField } from "@/lib/playback-analytics/beacon-keys";
import { FIRST_WORDS, LATER_WORDS } from "./mux-embed-source";

// mux-embed's shortening, as its shipped code does it: split the key on "_", the first word through
// the first dictionary, each later word through the second, integers kept as digits.
const invert = (d: Record<string, string>) => Object.fromEntries(Object.entries(d).map(([k, v]) => [v, k]));
const firstShort = invert(FIRST_WORDS);
const laterShort = invert(LATER_WORDS);
function shorten(key: string): string {
  const [first, ...rest] = key.split("_");
  return (firstShort[first] ?? `${first}_`) + rest.map((w) => laterShort[w] ?? (Number.isInteger(Number(w)) ? w : `_${w}_`)).join("");
}

describe("beacon keys", () => {
  it("the dictionaries were found in the installed mux-embed", () => {
    expect(FIRST_WORDS.x).toBe("view");
    expect(LATER_WORDS.wa).toBe("watch");
  });

  it.each(Object.entries(BEACON_FIELDS))("%s is sent by mux-embed as %s", (long, short) => {
    expect(shorten(long)).toBe(short);
  });

  it("reads a field under its short or its long name", () => {
    expect(beaconField({ xwati: 1200 }, "view_watch_time")).toBe(1200);
    expect(beaconField({ view_watch_time: 900 }, "view_watch_time")).toBe(900);
    expect(beaconField({}, "view_watch_time")).toBeUndefined();
  });
});
