"use client";
// Severity as radio buttons, each with its word, its written meaning and the condition rating it maps
// to, so a reviewer chooses from meanings, not from colours or numbers.
import { SEVERITIES_WORST_FIRST, SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";
import { FindingStone } from "./finding-stone";

export function SeverityField({ value, onChange, error }: { value: Severity | null; onChange(v: Severity): void; error?: string }) {
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={error ? "severity-err" : undefined}>
      <legend className="mb-1 text-sm font-medium">Severity</legend>
      {[...SEVERITIES_WORST_FIRST].reverse().map((s) => {
        const level = SEVERITY_SCALE[s];
        return (
          <label key={s} className={`flex cursor-pointer gap-2 rounded-md border px-2 py-1.5 text-sm ${value === s ? "border-lake bg-lake-soft" : "border-line"}`}>
            <input type="radio" name="severity" value={s} checked={value === s} onChange={() => onChange(s)} className="mt-1" />
            <FindingStone severity={s} />
            <span>
              <span className="font-medium">{level.label}</span>
              <span className="ml-1 text-xs text-ink-2">
                NBI {level.nbiRating} ({level.nbiWord})
              </span>
              <span className="block text-xs text-ink-2">{level.meaning}</span>
            </span>
          </label>
        );
      })}
      {error && (
        <p id="severity-err" role="alert" className="text-xs font-medium text-bad">
          {error}
        </p>
      )}
      <p className="text-xs text-ink-2">NBI: FHWA National Bridge Inventory condition rating, 9 excellent to 0 failed; the number a component showing this defect would rate at best.</p>
    </fieldset>
  );
}
