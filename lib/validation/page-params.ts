// The paging parameters every list accepts (?cursor=&pageSize=), as zod schemas with no server code,
// so route schemas that forms share can include them. The cursor's values are checked against the
// list's keys by decodeCursor (lib/api/keyset.ts).
import { z } from "zod";

/** Largest page any list serves; a list's own default may be smaller. */
export const MAX_PAGE_SIZE = 200;
export const MAX_CURSOR_CHARS = 4000;

export const cursorText = z.string().max(MAX_CURSOR_CHARS, "The cursor is too long").regex(/^[A-Za-z0-9_-]+$/, "The cursor is not valid");
/** `cursor` query parameter: shape only; its values are checked against the list's keys by decodeCursor. */
export const cursorParam = cursorText.optional();

export const keysetParams = (defaultPageSize: number) =>
  z.object({ cursor: cursorParam, pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(defaultPageSize) });
export type KeysetParams = { cursor?: string; pageSize: number };
