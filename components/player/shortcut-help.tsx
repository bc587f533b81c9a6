"use client";
// The keyboard shortcuts, listed in a small dialog opened with "?" or its button; Escape closes it.
import { useEffect, useRef } from "react";
import { SHORTCUTS } from "./review-shortcuts";

export function ShortcutHelp({ open, onClose }: { open: boolean; onClose(): void }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    ref.current?.focus();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") onClose();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [open, onClose]);
  if (!open) return null;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/30" onClick={onClose}>
      <div
        ref={ref}
        tabIndex={-1}
        role="dialog"
        aria-modal="true"
        aria-label="Keyboard shortcuts"
        className="w-full max-w-md rounded-lg border border-line bg-paper p-5 shadow-xl"
        onClick={(e) => e.stopPropagation()}
      >
        <div className="mb-3 flex items-center">
          <h2 className="text-lg font-semibold">Keyboard shortcuts</h2>
          <button type="button" className="ml-auto rounded px-2 py-1 text-sm hover:bg-paper-2" onClick={onClose}>
            Close ✕
          </button>
        </div>
        <table className="w-full text-sm">
          <tbody>
            {SHORTCUTS.map((s) => (
              <tr key={s.action} className="border-b border-line/60 last:border-0">
                <td className="py-1 pr-3">
                  {s.keys.map((k) => (
                    <kbd key={k} className="mr-1 rounded border border-line bg-paper-2 px-1.5 py-0.5 font-mono text-xs">
                      {k}
                    </kbd>
                  ))}
                </td>
                <td className="py-1">{s.label}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="mt-3 text-xs text-ink-2">Shortcuts pause while you type in a form field.</p>
      </div>
    </div>
  );
}
