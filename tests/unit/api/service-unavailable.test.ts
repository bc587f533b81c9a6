// Which errors mean "the database (or Redis) is away" (503) rather than a bug (500). The shapes are
// those postgres.js, drizzle-orm and Node's sockets produce; SQLSTATE codes from the PostgreSQL
// documentation, appendix A "PostgreSQL Error Codes".
import { describe, expect, it } from "vitest";
import { isServiceUnavailable } from "@/lib/api/service-unavailable";
import { errorBody } from "@/lib/api/errors";

const withCode = (code: string, message = "x") => Object.assign(new Error(message), { code });

describe("isServiceUnavailable", () => {
  it.each([
    ["a refused connection", withCode("ECONNREFUSED")],
    ["postgres.js: the connection closed", withCode("CONNECTION_CLOSED")],
    ["postgres.js: connect timeout", withCode("CONNECT_TIMEOUT")],
    ["57P01 admin_shutdown", withCode("57P01")],
    ["57P03 cannot_connect_now (starting up)", withCode("57P03")],
    ["08006 connection_failure", withCode("08006")],
    ["drizzle's wrapper around a refused connection", Object.assign(new Error("failed query: select 1"), { cause: withCode("ECONNREFUSED") })],
    ["both address families refused", Object.assign(new AggregateError([withCode("ECONNREFUSED"), withCode("ECONNREFUSED")]), { code: "" })],
  ])("%s: yes", (_label, err) => {
    expect(isServiceUnavailable(err)).toBe(true);
    expect(errorBody(err)).toMatchObject({ status: 503, body: { error: { code: "unavailable" } } });
  });

  it.each([
    ["a unique violation", withCode("23505")],
    ["a syntax error", withCode("42601")],
    ["a plain bug", new TypeError("undefined is not a function")],
    ["nothing", undefined],
  ])("%s: no", (_label, err) => {
    expect(isServiceUnavailable(err)).toBe(false);
  });
});
