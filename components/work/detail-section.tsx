// One titled section of a detail page (job, flight); the heading names it for screen readers too.
export function DetailSection({ id, title, actions, children }: { id: string; title: string; actions?: React.ReactNode; children: React.ReactNode }) {
  return (
    <section aria-labelledby={`${id}-title`} id={id} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3 border-b border-line pb-2">
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {title}
        </h2>
        {actions && <div className="ml-auto flex gap-2">{actions}</div>}
      </div>
      {children}
    </section>
  );
}

/** A label and its value in a detail list. */
export function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-xs font-medium uppercase tracking-wide text-ink-2">{label}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}
