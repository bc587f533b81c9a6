export function EmptyState({ title, next, action }: { title: string; next: string; action?: React.ReactNode }) {
  return (
    <div className="flex flex-col items-center gap-3 rounded-lg border border-dashed border-line px-6 py-10 text-center">
      <svg width="40" height="40" viewBox="0 0 32 32" aria-hidden className="opacity-40">
        <rect x="6" y="22" width="20" height="7" rx="3.5" className="fill-ink" />
        <rect x="9" y="14.5" width="14" height="6.5" rx="3.25" className="fill-ink" />
      </svg>
      <p className="font-medium">{title}</p>
      <p className="max-w-md text-sm text-ink-2">{next}</p>
      {action}
    </div>
  );
}
