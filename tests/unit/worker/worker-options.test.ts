// Worker timings from the environment: production defaults, test overrides, nonsense refused.
import { describe, expect, it } from "vitest";
import { workerTimings } from "@/worker/worker-options";

describe("workerTimings", () => {
  it("defaults to production values", () => {
    expect(workerTimings({})).toEqual({ lockDurationMs: 60_000, stalledIntervalMs: 30_000, reconcileEveryMs: 300_000, shutdownGraceMs: 20_000 });
  });

  it("reads overrides", () => {
    expect(workerTimings({ CAIRN_WORKER_LOCK_MS: "8000", CAIRN_WORKER_SHUTDOWN_MS: "300" })).toMatchObject({ lockDurationMs: 8000, shutdownGraceMs: 300 });
  });

  it("refuses a lock shorter than a second", () => {
    expect(() => workerTimings({ CAIRN_WORKER_LOCK_MS: "10" })).toThrow();
  });
});
