// The per-job timeout: the handler's AbortSignal fires and the job fails with a timeout error; an
// outer abort (worker shutdown) reaches the handler too. Checked with Node's own AbortController and
// child processes (a real `sleep` killed through the signal).
import { describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { JobTimeoutError, runWithTimeout } from "@/worker/run-with-timeout";

describe("runWithTimeout", () => {
  it("returns the handler's result when it finishes in time", async () => {
    await expect(runWithTimeout(1000, async () => 42)).resolves.toBe(42);
  });

  it("rethrows the handler's own error", async () => {
    await expect(runWithTimeout(1000, async () => Promise.reject(new Error("no video track")))).rejects.toThrow("no video track");
  });

  it("aborts the handler's signal and fails with a timeout error, killing the child it started", async () => {
    let exit: { code: number | null; signal: NodeJS.Signals | null } | null = null;
    const started = Date.now();
    const run = runWithTimeout(200, (signal) => {
      const child = spawn("sleep", ["30"], { signal });
      return new Promise<void>((resolve, reject) => {
        child.on("error", () => {});
        child.on("exit", (code, sig) => {
          exit = { code, signal: sig };
          if (code === 0) resolve();
          else reject(new Error("killed"));
        });
      });
    });
    await expect(run).rejects.toBeInstanceOf(JobTimeoutError);
    await expect(run).rejects.toThrow("timed out after 0.2 s");
    expect(Date.now() - started).toBeLessThan(5000);
    await new Promise((r) => setTimeout(r, 100));
    expect(exit).toMatchObject({ signal: "SIGTERM" });
  });

  it("passes an outer abort (shutdown) to the handler", async () => {
    const outer = new AbortController();
    const seen = runWithTimeout(10_000, (signal) => new Promise<string>((resolve) => signal.addEventListener("abort", () => resolve(String(signal.reason)))), outer.signal);
    outer.abort(new Error("the worker is shutting down"));
    await expect(seen).resolves.toContain("shutting down");
  });
});
