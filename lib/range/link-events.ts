// The three link events a range check records, with the word, meaning and shape the UI and the CSV
// use for each: a state is never told by colour alone (LOOK.md).
export const LINK_EVENTS = ["first_degradation", "total_loss", "reacquired"] as const;
export type LinkEvent = (typeof LINK_EVENTS)[number];

export type LinkEventShape = "circle" | "triangle" | "square";

export const LINK_EVENT_META: Record<LinkEvent, { label: string; meaning: string; shape: LinkEventShape; symbol: string }> = {
  first_degradation: {
    label: "First degradation",
    meaning: "The first frames arrive damaged: break-up, frozen blocks or missing slices, but video still shows.",
    shape: "circle",
    symbol: "●",
  },
  total_loss: {
    label: "Total loss",
    meaning: "No usable video arrives any more: the picture is lost.",
    shape: "triangle",
    symbol: "▲",
  },
  reacquired: {
    label: "Reacquired",
    meaning: "Intact video returns after a degradation or a loss.",
    shape: "square",
    symbol: "■",
  },
};

