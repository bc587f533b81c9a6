"use client";
// The one answer for an address that cannot be opened: it does not exist, it was removed, it belongs to
// another organisation or client, or the role may not use the page. The words are the same in every
// case, so the answer reveals nothing about what exists (docs/product-rules.md, "Rules of the house");
// the HTTP status stays 404. It offers the way back: the previous page, the start page, the jobs list.
// Used by app/(workspace)/not-found.tsx (inside the workspace frame) and app/not-found.tsx.
import Link from "next/link";
import { useRouter } from "next/navigation";

export const REFUSAL_TITLE = "Not found, or not open to you";

export function Refusal() {
  const router = useRouter();
  return (
    <section aria-labelledby="refusal-title" data-testid="refusal" className="mx-auto flex max-w-xl flex-col gap-4 rounded-lg border border-line bg-paper p-6">
      <div className="flex items-center gap-3">
        <svg width="36" height="36" viewBox="0 0 32 32" aria-hidden className="shrink-0 opacity-50">
          <rect x="6" y="22" width="20" height="7" rx="3.5" className="fill-ink" />
          <rect x="9" y="14.5" width="14" height="6.5" rx="3.25" className="fill-ink" />
          <rect x="12" y="8" width="8" height="5.5" rx="2.75" className="fill-none stroke-ink" strokeDasharray="2 2" />
        </svg>
        <h1 id="refusal-title" className="text-xl font-semibold tracking-tight">
          {REFUSAL_TITLE}
        </h1>
      </div>
      <p className="text-sm">
        There is nothing at this address that your account can open. It may never have existed, it may have been removed, or it may belong to work or a page your
        role does not cover. Cairn gives this same answer in every case, so it says nothing about what others keep.
      </p>
      <p className="text-sm text-ink-2">If you expected to see it, check the address, or ask an owner of your organisation for access.</p>
      <div className="flex flex-wrap gap-2">
        <button type="button" onClick={() => router.back()} className="inline-flex min-h-10 items-center rounded-md border border-line px-4 text-sm hover:bg-paper-2">
          ← Back
        </button>
        <Link href="/today" className="inline-flex min-h-10 items-center rounded-md border border-lake bg-lake px-4 text-sm font-medium text-on-lake hover:bg-lake-dark">
          Go to Today
        </Link>
        <Link href="/jobs" className="inline-flex min-h-10 items-center rounded-md border border-line px-4 text-sm hover:bg-paper-2">
          All jobs
        </Link>
      </div>
    </section>
  );
}
