// The three link events a range check records, with the word, meaning and shape the UI and the CSV
// use for each, in the crew's own words ("picture breaking up", "video lost", "video back"): a state is
// never told by colour alone.
export const LINK_EVENTS = ["first_degradation", "total_loss", "reacquired"] as const;
export type LinkEvent = (typeof LINK_EVENTS)[number];

export type LinkEventShape = "circle" | "triangle" | "square";

export const LINK_EVENT_META: Record<LinkEvent, { label: string; meaning: string; shape: LinkEventShape; symbol: string }> = {
  first_degradation: {
    label: "Picture breaking up",
    meaning: "Frames arrive damaged: break-up, frozen blocks or missing slices, but video still shows.",
    shape: "circle",
    symbol: "●",
  },
  total_loss: {
    label: "Video lost",
    meaning: "No usable video arrives any more: the picture is lost.",
    shape: "triangle",
    symbol: "▲",
  },
  reacquired: {
    label: "Video back",
    meaning: "Intact video returns after the picture broke up or the video was lost.",
    shape: "square",
    symbol: "■",
  },
};

