// A link event as a shape and a word together: the shape matches the chart's marker, the word says it.
import { LINK_EVENT_META, type LinkEvent } from "@/lib/range-checks/link-events";

export function LinkEventShape({ event, size = 12 }: { event: LinkEvent; size?: number }) {
  const shape = LINK_EVENT_META[event].shape;
  return (
    <svg width={size} height={size} viewBox="0 0 12 12" aria-hidden className="inline-block shrink-0">
      {shape === "circle" && <circle cx="6" cy="6" r="5" className="fill-lake" />}
      {shape === "triangle" && <path d="M6 1 L11 11 L1 11 Z" className="fill-bad" />}
      {shape === "square" && <rect x="1.5" y="1.5" width="9" height="9" className="fill-ink" />}
    </svg>
  );
}

export function LinkEventMark({ event }: { event: LinkEvent }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap" title={LINK_EVENT_META[event].meaning}>
      <LinkEventShape event={event} />
      {LINK_EVENT_META[event].label}
    </span>
  );
}
