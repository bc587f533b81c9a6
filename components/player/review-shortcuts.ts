// The review room's keyboard shortcuts, one table for the handler and the help overlay.
export type ShortcutAction =
  | "toggle-play"
  | "frame-back"
  | "frame-forward"
  | "second-back"
  | "second-forward"
  | "jump-back"
  | "jump-forward"
  | "first-frame"
  | "last-frame"
  | "slower"
  | "faster"
  | "mark"
  | "range-start"
  | "range-end"
  | "draw-box"
  | "help";

export const SHORTCUTS: { keys: string[]; label: string; action: ShortcutAction }[] = [
  { keys: ["Space", "k"], label: "Play or pause", action: "toggle-play" },
  { keys: [","], label: "One frame back (pauses)", action: "frame-back" },
  { keys: ["."], label: "One frame forward (pauses)", action: "frame-forward" },
  { keys: ["←"], label: "1 second back", action: "second-back" },
  { keys: ["→"], label: "1 second forward", action: "second-forward" },
  { keys: ["j"], label: "10 seconds back", action: "jump-back" },
  { keys: ["l"], label: "10 seconds forward", action: "jump-forward" },
  { keys: ["Home"], label: "First frame", action: "first-frame" },
  { keys: ["End"], label: "Last frame", action: "last-frame" },
  { keys: ["["], label: "Slower playback", action: "slower" },
  { keys: ["]"], label: "Faster playback", action: "faster" },
  { keys: ["m"], label: "Mark a finding at this frame", action: "mark" },
  { keys: ["i"], label: "Range starts at this frame", action: "range-start" },
  { keys: ["o"], label: "Range ends at this frame", action: "range-end" },
  { keys: ["b"], label: "Draw a box on the frame", action: "draw-box" },
  { keys: ["?"], label: "Show or hide these shortcuts", action: "help" },
];

const BY_KEY: Record<string, ShortcutAction> = {
  " ": "toggle-play",
  k: "toggle-play",
  ",": "frame-back",
  ".": "frame-forward",
  ArrowLeft: "second-back",
  ArrowRight: "second-forward",
  j: "jump-back",
  l: "jump-forward",
  Home: "first-frame",
  End: "last-frame",
  "[": "slower",
  "]": "faster",
  m: "mark",
  i: "range-start",
  o: "range-end",
  b: "draw-box",
  "?": "help",
};

/** The action for a key press, or null when the key is not ours or the user is typing. */
export function shortcutFor(e: { key: string; ctrlKey: boolean; metaKey: boolean; altKey: boolean; target: EventTarget | null }): ShortcutAction | null {
  if (e.ctrlKey || e.metaKey || e.altKey) return null;
  const t = e.target as HTMLElement | null;
  if (t && (t.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName))) return null;
  // Space and Enter on a focused button or link press it, as everywhere else on the page
  if (t && /^(BUTTON|A|SUMMARY)$/.test(t.tagName) && (e.key === " " || e.key === "Enter")) return null;
  return BY_KEY[e.key] ?? null;
}

export const PLAYBACK_RATES = [0.1, 0.25, 0.5, 1, 1.5, 2, 4];
