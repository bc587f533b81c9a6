// The wordmark: three rounded stones stacked (a cairn marks a place on a trail).
export function CairnMark({ size = 28, withName = true }: { size?: number; withName?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
        <rect x="6" y="22" width="20" height="7" rx="3.5" className="fill-ink" />
        <rect x="9" y="14.5" width="14" height="6.5" rx="3.25" className="fill-ink" />
        <rect x="12" y="7.5" width="8" height="6" rx="3" className="fill-lake" />
      </svg>
      {withName && <span className="text-lg font-semibold tracking-tight">Cairn</span>}
    </span>
  );
}
