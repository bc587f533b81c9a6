// A quiet bordered caution beside the figure it qualifies: one-line summary, full text on demand.
// Never a modal (docs/look.md, "Cautions").
export function Caution({ summary, detail, sources }: { summary: string; detail?: string; sources?: string[] }) {
  return (
    <aside role="note" className="rounded-md border border-warn/60 bg-warn-soft px-3 py-2 text-sm text-ink">
      <p className="font-medium">
        <span aria-hidden className="mr-1">△</span>
        Caution: {summary}
      </p>
      {detail && (
        <details className="mt-1">
          <summary className="cursor-pointer text-xs underline">Read the full caution</summary>
          <p className="mt-1 text-xs">{detail}</p>
          {sources && sources.length > 0 && <p className="mt-1 text-xs text-ink-2">Sources: {sources.join("; ")}</p>}
        </details>
      )}
    </aside>
  );
}
