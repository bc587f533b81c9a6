"use client";
// Feet or metres for every length on the page; the choice is remembered for the signed-in person.
import type { DisplayUnits } from "@/lib/validation/range-checks";

const LABELS: Record<DisplayUnits, string> = { ft: "Feet (ft)", m: "Metres (m)" };

export function UnitsToggle({ units, onChange, saving, error }: { units: DisplayUnits; onChange: (u: DisplayUnits) => void; saving?: boolean; error?: string | null }) {
  return (
    <div className="flex flex-col items-end gap-1">
      <div role="group" aria-label="Length units" className="inline-flex rounded-md border border-line bg-paper-2 p-0.5">
        {(["ft", "m"] as const).map((u) => (
          <button
            key={u}
            type="button"
            aria-pressed={units === u}
            onClick={() => units !== u && onChange(u)}
            className={`min-h-10 rounded px-3 text-sm font-medium ${units === u ? "bg-lake text-on-lake" : "text-ink hover:bg-paper"}`}
          >
            {LABELS[u]}
          </button>
        ))}
      </div>
      <p className="text-xs text-ink-2" aria-live="polite">
        {error ? <span className="text-bad">{error}</span> : saving ? "Saving your choice…" : "Remembered for your account"}
      </p>
    </div>
  );
}
