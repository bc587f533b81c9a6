// How a link state is drawn on the track plan and the distance chart: a word, a line pattern and a colour
// that only repeats what the word and the pattern say (docs/look.md, "Never colour alone").
export const TRACK_LINK_STYLE = {
  intact: { word: "Clear picture", dash: undefined, width: 3, className: "stroke-lake", legend: "solid line" },
  damaged: { word: "Picture breaking up", dash: "7 4", width: 3, className: "stroke-warn", legend: "dashed line" },
  lost: { word: "Video lost", dash: "1.5 4", width: 3.5, className: "stroke-bad", legend: "dotted line" },
  unrecorded: { word: "Not recorded", dash: undefined, width: 1, className: "stroke-ink-2", legend: "thin line" },
} as const;

export type TrackLinkState = keyof typeof TRACK_LINK_STYLE;
