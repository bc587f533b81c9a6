"use client";
// Page numbers over a keyset-paged list: remembers the `nextCursor` each page answered with, so page
// n + 1 is asked for with a cursor (a keyset read) instead of an OFFSET. A page whose cursor is not
// known yet (a jump) falls back to `page=`, which the API still serves for the first pages.
import { useCallback, useRef } from "react";

export function useKeysetCursors(listKey: string) {
  const cursors = useRef<{ key: string; byPage: Map<number, string> }>({ key: listKey, byPage: new Map() });
  if (cursors.current.key !== listKey) cursors.current = { key: listKey, byPage: new Map() };
  /** the paging parameters for `page`: `cursor=` when known, else `page=` */
  const paging = useCallback((page: number): Record<string, string> => {
    const cursor = page > 1 ? cursors.current.byPage.get(page) : undefined;
    return cursor ? { cursor } : { page: String(page) };
  }, []);
  /** call with the answer of `page`: its nextCursor opens page + 1 */
  const remember = useCallback((page: number, nextCursor: string | null | undefined) => {
    if (nextCursor) cursors.current.byPage.set(page + 1, nextCursor);
  }, []);
  return { paging, remember };
}
