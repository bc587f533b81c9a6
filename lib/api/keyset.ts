// Keyset paging for every list: the answer carries `nextCursor`, an opaque base64url token holding the
// ORDER BY values of the page's last row (as PostgreSQL printed them) and the ordering they belong to.
// The next page asks for rows strictly after those values, so a deep page costs what the first does
// (no OFFSET walk) and rows inserted meanwhile never shift a page. The cursor is not secret: it only
// positions the list, and every query keeps its organisation filter. A cursor that is garbled, forged
// or made for another ordering is a 422 before any SQL runs (each value is checked against its key's
// type here, so PostgreSQL never sees a value it would refuse with an error, i.e. a 500).
import "server-only";
import { and, count, isNull, or, sql, type AnyColumn, type SQL } from "drizzle-orm";
import type { PgSelect } from "drizzle-orm/pg-core";
import { db } from "@/db/client";
import { z } from "zod";
import { ApiError } from "./errors";
import { MAX_CURSOR_CHARS, MAX_PAGE_SIZE, cursorParam, cursorText, keysetParams, type KeysetParams } from "@/lib/validation/page-params";

export { MAX_CURSOR_CHARS, MAX_PAGE_SIZE, cursorParam, keysetParams, type KeysetParams };

/** The SQL types a key's value can be cast back to. `enum` names its PostgreSQL enum type and values. */
export type KeyType =
  | "text"
  | "uuid"
  | "int"
  | "bigint"
  | "real"
  | "double precision"
  | "timestamptz"
  | "date"
  | { enumName: string; enumValues: readonly string[] };

export type KeyPart = {
  expr: SQL | AnyColumn;
  dir: "asc" | "desc";
  type: KeyType;
  /** a NOT NULL key lets the whole ordering use one row comparison, which a btree index serves */
  notNull?: boolean;
};

const cursorBody = z.object({ o: z.string().max(200), v: z.array(z.string().max(1000).nullable()).min(1).max(12) });

function invalid(message = "The cursor is not valid for this list; start again from the first page"): never {
  throw new ApiError("unprocessable", message, { cursor: [message] });
}

export function encodeCursor(ordering: string, values: (string | null)[]): string {
  return Buffer.from(JSON.stringify({ o: ordering, v: values }), "utf8").toString("base64url");
}

const pad2 = (s: string) => Number(s);
function validDate(y: string, m: string, d: string): boolean {
  const year = Number(y), month = pad2(m), day = pad2(d);
  if (year < 1 || month < 1 || month > 12 || day < 1) return false;
  const t = new Date(Date.UTC(2000, month - 1, day)); // leap year stands in: 29 Feb is checked below
  if (t.getUTCMonth() !== month - 1) return false;
  if (month === 2 && day === 29) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return true;
}
const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
// PostgreSQL's ISO output of timestamptz (DateStyle ISO): "2026-12-03 03:46:31.123456+00", offset may carry minutes
const TIMESTAMPTZ = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2}):(\d{2})(\.\d{1,6})?([+-])(\d{2})(?::?(\d{2}))?(?::(\d{2}))?$/;
const INTEGER = /^-?\d{1,19}$/;
const FLOAT = /^(-?(\d{1,40}(\.\d{0,40})?|\.\d{1,40})([eE][+-]?\d{1,3})?|-?Infinity|NaN)$/;
// in a `u` regex a surrogate range matches only surrogates that are not part of a pair
const LONE_SURROGATE = /[\uD800-\uDFFF]/u;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const INT_RANGE: Record<"int" | "bigint", [bigint, bigint]> = {
  int: [-(2n ** 31n), 2n ** 31n - 1n],
  bigint: [-(2n ** 63n), 2n ** 63n - 1n],
};

/** True when PostgreSQL accepts `value` as `type` (the cast in `after` cannot fail). */
export function valueFits(type: KeyType, value: string): boolean {
  // a drizzle pgEnum is a function carrying enumName and enumValues
  if (typeof type !== "string") return type.enumValues.includes(value);
  switch (type) {
    case "text":
      // PostgreSQL text cannot hold NUL; a lone surrogate is not text either
      return !value.includes("\u0000") && !LONE_SURROGATE.test(value);
    case "uuid":
      return UUID.test(value);
    case "int":
    case "bigint": {
      if (!INTEGER.test(value)) return false;
      const n = BigInt(value);
      return n >= INT_RANGE[type][0] && n <= INT_RANGE[type][1];
    }
    case "real":
    case "double precision":
      return FLOAT.test(value);
    case "date": {
      const m = DATE.exec(value);
      return !!m && validDate(m[1], m[2], m[3]);
    }
    case "timestamptz": {
      const m = TIMESTAMPTZ.exec(value);
      if (!m || !validDate(m[1], m[2], m[3])) return false;
      const [h, mi, s, oh, om, os] = [m[4], m[5], m[6], m[9], m[10] ?? "0", m[11] ?? "0"].map(Number);
      // PostgreSQL accepts UTC offsets up to 15:59:59 (its documentation, "Date/Time Input")
      return h <= 23 && mi <= 59 && s <= 59 && oh <= 15 && om <= 59 && os <= 59;
    }
  }
}

/**
 * The values stored in `cursor`, checked: made for this `ordering`, one per key, each a value of its
 * key's type, NULL only where the key may be NULL. Anything else is a 422.
 */
export function decodeCursor(cursor: string, ordering: string, keys: KeyPart[]): (string | null)[] {
  if (!cursorText.safeParse(cursor).success) invalid();
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
  } catch {
    invalid();
  }
  const body = cursorBody.safeParse(parsed);
  if (!body.success) invalid();
  if (body.data.o !== ordering) invalid("The cursor belongs to another sort order; start again from the first page");
  if (body.data.v.length !== keys.length) invalid();
  body.data.v.forEach((v, i) => {
    if (v === null ? keys[i].notNull : !valueFits(keys[i].type, v)) invalid();
  });
  return body.data.v;
}

const castTo = (type: KeyType) => (typeof type !== "string" ? sql.raw(`"${type.enumName.replace(/"/g, '""')}"`) : sql.raw(type));
const valueOf = (k: KeyPart, v: string) => sql`cast(${v} as ${castTo(k.type)})`;

/**
 * ORDER BY for the keys: NULLs always last, whichever the direction. A NOT NULL key is written without
 * NULLS LAST so that a backward scan of an ascending index still serves a descending order.
 */
export function keysetOrder(keys: KeyPart[]): SQL[] {
  return keys.map((k) => (k.notNull ? sql`${k.expr} ${sql.raw(k.dir)}` : sql`${k.expr} ${sql.raw(k.dir)} nulls last`));
}

/** The keys as text columns `__k0`, `__k1`, ... to select beside the row; read back by pageOfRows. */
export function keysetColumns(keys: KeyPart[]): Record<string, SQL<string | null>> {
  return Object.fromEntries(keys.map((k, i) => [`__k${i}`, sql<string | null>`(${k.expr})::text`]));
}

/** Rows strictly after `values` in the order of `keys` (NULLs last). */
export function keysetAfter(keys: KeyPart[], values: (string | null)[]): SQL {
  const sameDir = keys.every((k) => k.dir === keys[0].dir);
  if (sameDir && keys.every((k) => k.notNull)) {
    // one row comparison: PostgreSQL turns it into a btree index condition
    const lhs = sql.join(keys.map((k) => sql`${k.expr}`), sql`, `);
    const rhs = sql.join(keys.map((k, i) => valueOf(k, values[i]!)), sql`, `);
    return keys[0].dir === "asc" ? sql`(${lhs}) > (${rhs})` : sql`(${lhs}) < (${rhs})`;
  }
  // general form: for some i, equal on keys before i and strictly after on key i
  const branches: SQL[] = [];
  for (let i = 0; i < keys.length; i++) {
    const k = keys[i];
    const v = values[i];
    if (v === null) continue; // NULL sorts last: nothing is strictly after it on this key
    const beyond = k.dir === "asc" ? sql`${k.expr} > ${valueOf(k, v)}` : sql`${k.expr} < ${valueOf(k, v)}`;
    const step = k.notNull ? beyond : or(beyond, isNull(k.expr))!;
    const equalBefore = keys.slice(0, i).map((p, j) => (values[j] === null ? isNull(p.expr) : sql`${p.expr} = ${valueOf(p, values[j]!)}`));
    branches.push(and(...equalBefore, step)!);
  }
  return branches.length ? or(...branches)! : sql`false`;
}

export type Page<T> = { items: T[]; nextCursor: string | null };

/**
 * Cuts the `limit + 1` rows a keyset query fetched into one page: the extra row only says there is a
 * next page, whose cursor is the last kept row's key values. Strips the `__k` columns.
 */
export function pageOfRows<T extends Record<string, unknown>>(rows: T[], limit: number, ordering: string, keys: KeyPart[]): Page<Omit<T, `__k${number}`>> {
  const kept = rows.slice(0, limit);
  const last = kept[kept.length - 1];
  const nextCursor = rows.length > limit && last ? encodeCursor(ordering, keys.map((_, i) => (last[`__k${i}`] as string | null) ?? null)) : null;
  const items = kept.map((r) => {
    const out: Record<string, unknown> = {};
    for (const [name, value] of Object.entries(r)) if (!name.startsWith("__k")) out[name] = value;
    return out as Omit<T, `__k${number}`>;
  });
  return { items, nextCursor };
}

/** The keyset condition for a request: none on the first page, else the rows after its cursor. */
export function afterCursor(cursor: string | undefined, ordering: string, keys: KeyPart[]): SQL | undefined {
  return cursor ? keysetAfter(keys, decodeCursor(cursor, ordering, keys)) : undefined;
}

/** `cursor` and `pageSize` for a list that has no search or sort of its own (a recording's views, a job's share links). */


/**
 * Lists count their rows only up to COUNT_CAP: an exact count(*) walks every matching row, so it grows
 * with the data while the keyset page does not (bench/list-api.ts measured 63 ms for one count over an
 * organisation's 1,000,000 custody events, against 0.05 ms for its page). Beyond the cap the answer
 * says `totalIsLowerBound: true` and the pages show "at least" the figure.
 */
export const COUNT_CAP = 1000;

export type ListTotal = { total: number; totalIsLowerBound: boolean };

/** Counts the rows `rows` selects (its FROM, joins and WHERE; the select list is not read), up to COUNT_CAP. */
export async function countUpTo(rows: PgSelect): Promise<ListTotal> {
  const capped = rows.limit(COUNT_CAP + 1).as("capped_rows");
  const [{ n }] = await db().select({ n: count() }).from(capped);
  return { total: Math.min(n, COUNT_CAP), totalIsLowerBound: n > COUNT_CAP };
}
