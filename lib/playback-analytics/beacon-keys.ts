// The fields Cairn reads from mux-embed's beacons. mux-embed shortens every key before sending: the
// first word through one dictionary (view -> "x", video -> "v", viewer -> "u", event -> "e"), each
// further word through another (watch -> "wa", time -> "ti", ...), numbers kept as they are.
// The short forms below follow mux-embed 5.x's dictionaries (tests/unit/playback checks them against
// the copy in node_modules); the long names are accepted too, for clients that do not shorten.
export const BEACON_FIELDS = {
  event: "e",
  view_id: "xid",
  video_id: "vid",
  viewer_user_id: "uusid",
  view_start: "xst",
  viewer_time: "uti",
  view_watch_time: "xwati",
  view_time_to_first_frame: "xtitofifr",
  view_rebuffer_count: "xreco",
  view_rebuffer_duration: "xredu",
  custom_1: "c1",
} as const;

export type BeaconField = keyof typeof BEACON_FIELDS;

/** A field of one beacon event, under its short or long name. */
export function beaconField(event: Record<string, unknown>, field: BeaconField): unknown {
  const short = BEACON_FIELDS[field];
  return short in event ? event[short] : event[field];
}
