"use client";
// The person's ft/m choice: shown at once, saved in the background, remembered for their next visit.
import { useCallback, useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import type { DisplayUnits } from "@/lib/validation/range-checks";

export function usePreferredUnits(initial: DisplayUnits) {
  const [units, setLocal] = useState<DisplayUnits>(initial);
  const [saveError, setSaveError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const setUnits = useCallback(async (next: DisplayUnits) => {
    setLocal(next);
    setSaving(true);
    setSaveError(null);
    try {
      await fetchJson("/api/users/me/preferences", { method: "PATCH", json: { preferredUnits: next } });
    } catch (err) {
      // the page keeps working in the chosen unit; only the remembering failed, and it says so
      setSaveError(`Shown in ${next}, but not remembered: ${(err as Error).message}`);
    } finally {
      setSaving(false);
    }
  }, []);
  return { units, setUnits, saving, saveError };
}
