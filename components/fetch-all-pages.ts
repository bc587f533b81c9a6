// Reads every page of a keyset-paged list (`{ items, nextCursor }`, lib/api/keyset.ts) for a view that
// needs the whole list at once (a recording's findings drawn over the picture, a job's share links).
// Stops after `maxPages` so a runaway list cannot keep the browser busy.
import { fetchJson } from "@/components/fetch-json";

export type KeysetPage<T> = { items: T[]; nextCursor?: string | null; total?: number };

export async function fetchAllPages<T>(url: string, maxPages = 50): Promise<{ items: T[]; total: number }> {
  const items: T[] = [];
  let cursor: string | null | undefined;
  let total = 0;
  for (let i = 0; i < maxPages; i++) {
    const sep = url.includes("?") ? "&" : "?";
    const page = await fetchJson<KeysetPage<T>>(cursor ? `${url}${sep}cursor=${encodeURIComponent(cursor)}` : url);
    items.push(...page.items);
    total = page.total ?? items.length;
    cursor = page.nextCursor;
    if (!cursor) break;
  }
  return { items, total };
}
