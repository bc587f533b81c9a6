"use client";
// A SHA-256 shown as the first 8 and last 4 hex digits in mono, full value on focus, with a copy button.
import { useState } from "react";

export function HashText({ value, label = "SHA-256" }: { value: string; label?: string }) {
  const [copied, setCopied] = useState(false);
  const short = value.length > 12 ? `${value.slice(0, 8)}…${value.slice(-4)}` : value;
  return (
    <span className="group inline-flex items-center gap-1">
      <span
        tabIndex={0}
        title={value}
        data-hash={value}
        className="rounded font-mono text-xs focus:bg-lake-soft"
      >
        {/* read out whole once; the short and long forms are for the eye */}
        <span className="sr-only">
          {label} {value}
        </span>
        <span aria-hidden className="group-focus-within:hidden">
          {short}
        </span>
        <span aria-hidden className="hidden break-all group-focus-within:inline">
          {value}
        </span>
      </span>
      <button
        type="button"
        className="rounded border border-line px-1 text-[10px] hover:bg-paper-2"
        onClick={() => {
          void navigator.clipboard?.writeText(value).then(() => {
            setCopied(true);
            setTimeout(() => setCopied(false), 1500);
          });
        }}
        aria-label={`Copy ${label}`}
      >
        {copied ? "Copied" : "Copy"}
      </button>
    </span>
  );
}
