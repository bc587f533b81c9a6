// The keyset cursor's checks (lib/api/keyset.ts), without a database: a cursor round-trips, and each
// value is accepted only in a form PostgreSQL itself prints and accepts back for its type, so a
// forged one is a 422 (ApiError "unprocessable") before any SQL. The accepted forms are PostgreSQL's
// ISO output (its documentation, "Date/Time Output", DateStyle ISO: "1997-12-17 07:37:16-08") and
// the integer ranges of its documentation, "Numeric Types" (integer -2147483648 to +2147483647,
// bigint -9223372036854775808 to +9223372036854775807); UTC offsets up to 15:59:59 either way is
// PostgreSQL's limit as recalled from memory (the refused "+16" is beyond it). The integration test
// tests/integration/lists/keyset-paging.test.ts sends such cursors to the real database.
import { describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { decodeCursor, encodeCursor, pageOfRows, valueFits, type KeyPart } from "@/lib/api/keyset";
import { ApiError } from "@/lib/api/errors";

const keys: KeyPart[] = [
  { expr: sql`a`, dir: "asc", type: "timestamptz", notNull: true },
  { expr: sql`b`, dir: "asc", type: "int" },
  { expr: sql`c`, dir: "asc", type: "uuid", notNull: true },
];
const id = "3f2504e0-4f89-41d3-9a0c-0305e82c3301";

function refused(run: () => unknown) {
  try {
    run();
  } catch (err) {
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).status).toBe(422);
    expect(Object.keys((err as ApiError).fields ?? {})).toEqual(["cursor"]);
    return;
  }
  throw new Error("accepted");
}

describe("keyset cursors", () => {
  it("round-trip the values of the last row, NULL included where the key allows it", () => {
    const values = ["2026-12-03 03:46:31.123456+00", null, id];
    expect(decodeCursor(encodeCursor("default", values), "default", keys)).toEqual(values);
  });

  it("pageOfRows keeps `limit` rows, strips the key columns and makes the cursor from the last kept row", () => {
    const rows = [1, 2, 3].map((n) => ({ id: `r${n}`, __k0: `2026-01-0${n} 00:00:00+00`, __k1: String(n), __k2: id }));
    const page = pageOfRows(rows, 2, "default", keys);
    expect(page.items).toEqual([{ id: "r1" }, { id: "r2" }]);
    expect(decodeCursor(page.nextCursor!, "default", keys)).toEqual(["2026-01-02 00:00:00+00", "2", id]);
    expect(pageOfRows(rows, 3, "default", keys).nextCursor).toBeNull();
  });

  it("refuses another ordering, the wrong number of values, NULL on a NOT NULL key, and garbage", () => {
    const good = ["2026-12-03 03:46:31+00", "1", id];
    refused(() => decodeCursor(encodeCursor("name:asc", good), "default", keys));
    refused(() => decodeCursor(encodeCursor("default", good.slice(0, 2)), "default", keys));
    refused(() => decodeCursor(encodeCursor("default", [null, "1", id]), "default", keys));
    refused(() => decodeCursor("!!", "default", keys));
    refused(() => decodeCursor(Buffer.from("[1,2]").toString("base64url"), "default", keys));
    refused(() => decodeCursor("A".repeat(4001), "default", keys));
  });

  it("timestamps: PostgreSQL's ISO output forms pass, impossible dates and times do not", () => {
    for (const ok of ["1997-12-17 07:37:16-08", "2026-12-03 03:46:31.123456+00", "2024-02-29 23:59:59+05:30", "2026-06-01 12:00:00+05:45:00"]) expect(valueFits("timestamptz", ok), ok).toBe(true);
    for (const bad of ["2026-02-29 00:00:00+00", "2026-13-01 00:00:00+00", "2026-01-01 24:00:00+00", "2026-01-01 00:60:00+00", "2026-01-01 00:00:00", "2026-01-01 00:00:00+16", "yesterday", "2026-01-01 00:00:00+00; drop table x"])
      expect(valueFits("timestamptz", bad), bad).toBe(false);
  });

  it("integers within their PostgreSQL range only; dates, UUIDs, enums and text", () => {
    expect(valueFits("int", "2147483647")).toBe(true);
    expect(valueFits("int", "-2147483648")).toBe(true);
    expect(valueFits("int", "2147483648")).toBe(false);
    expect(valueFits("bigint", "9223372036854775807")).toBe(true);
    expect(valueFits("bigint", "9223372036854775808")).toBe(false);
    expect(valueFits("int", "1.5")).toBe(false);
    expect(valueFits("double precision", "1.5e+30")).toBe(true);
    expect(valueFits("double precision", "1,5")).toBe(false);
    expect(valueFits("date", "2000-02-29")).toBe(true);
    expect(valueFits("date", "1900-02-29")).toBe(false); // 1900 is no leap year (Gregorian rule)
    expect(valueFits("uuid", id)).toBe(true);
    expect(valueFits("uuid", "not-a-uuid")).toBe(false);
    expect(valueFits({ enumName: "processing_state", enumValues: ["waiting", "ready"] }, "ready")).toBe(true);
    expect(valueFits({ enumName: "processing_state", enumValues: ["waiting", "ready"] }, "lost")).toBe(false);
    expect(valueFits("text", "Überflug Süd 1.264")).toBe(true);
    expect(valueFits("text", "a\u0000b")).toBe(false);
    expect(valueFits("text", "a\ud800b")).toBe(false);
    expect(valueFits("text", "😀")).toBe(true);
  });
});
