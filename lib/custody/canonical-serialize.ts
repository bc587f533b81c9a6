// Canonical serialization of a custody event: the exact bytes its hash covers.
//
// Format: the JSON Canonicalization Scheme (RFC 8785, "JCS") for the subset of values we store,
// encoded as UTF-8 by the hasher:
// - objects: members sorted by key, comparing UTF-16 code units (RFC 8785 3.2.3); no whitespace;
//   nested objects sorted the same way; arrays keep their order.
// - strings: JSON string escaping as ECMAScript's JSON.stringify writes it (RFC 8785 3.2.2.2);
//   lone surrogates are refused (RFC 8785 requires well-formed I-JSON text).
// - numbers: ECMAScript Number-to-String (RFC 8785 3.2.2.3), so 4.50 is 4.5 and 1e30 is 1e+30;
//   NaN and the infinities are refused. -0 is written 0.
// - true / false / null as literals.
// Our additions, outside JCS (which knows only JSON values):
// - Date becomes its ISO-8601 UTC string with milliseconds, "2025-03-01T09:30:00.000Z".
//   A JS Date holds milliseconds; Postgres timestamptz holds microseconds. Set the time in the
//   application (not with a database default such as now()) so the stored value is the hashed one.
// - undefined (a missing member or array slot) becomes null, so an event hashed in memory with an
//   optional field left out hashes the same as the row read back with that column NULL.
// Anything else (bigint, Map, Buffer, class instances, functions, symbols, cycles) is refused:
// silently turning it into "{}" would make different events hash alike.

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function serializeString(value: string): string {
  if (LONE_SURROGATE.test(value)) throw new TypeError("canonical JSON refuses strings with lone surrogates");
  return JSON.stringify(value);
}

function isPlainObject(value: object): value is Record<string, unknown> {
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
}

function serialize(value: unknown, ancestors: Set<object>): string {
  if (value === null || value === undefined) return "null";
  switch (typeof value) {
    case "boolean":
      return value ? "true" : "false";
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`canonical JSON refuses the number ${value}`);
      return JSON.stringify(value);
    case "string":
      return serializeString(value);
    case "object":
      break;
    default:
      throw new TypeError(`canonical JSON refuses a value of type ${typeof value}`);
  }

  if (value instanceof Date) {
    if (Number.isNaN(value.getTime())) throw new TypeError("canonical JSON refuses an invalid Date");
    return JSON.stringify(value.toISOString());
  }
  if (ancestors.has(value)) throw new TypeError("canonical JSON refuses a cyclic structure");
  ancestors.add(value);
  try {
    if (Array.isArray(value)) {
      const items: string[] = [];
      for (let i = 0; i < value.length; i++) items.push(serialize(value[i], ancestors));
      return `[${items.join(",")}]`;
    }
    if (!isPlainObject(value)) {
      throw new TypeError(`canonical JSON refuses an instance of ${value.constructor?.name ?? "an unknown class"}`);
    }
    const keys = Object.keys(value).sort(); // default sort compares UTF-16 code units, as RFC 8785 3.2.3 asks
    const members = keys.map((key) => `${serializeString(key)}:${serialize(value[key], ancestors)}`);
    return `{${members.join(",")}}`;
  } finally {
    ancestors.delete(value);
  }
}

export function canonicalSerialize(value: unknown): string {
  return serialize(value, new Set());
}
