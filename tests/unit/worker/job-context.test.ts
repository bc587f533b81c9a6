import { describe, expect, it } from "vitest";
import type { Job } from "bullmq";
import { jobContext } from "@/worker/handlers/job-context";
import { handlers } from "@/worker/handlers";

describe("jobContext: what every handler receives from a BullMQ job", () => {
  it("carries the signal, the queue job's id and the attempt counted from 1", () => {
    const signal = new AbortController().signal;
    const ctx = jobContext({ id: "q-7", attemptsMade: 2, updateProgress: async () => {} } as unknown as Job, signal);
    expect(ctx.signal).toBe(signal);
    expect(ctx.queueJobId).toBe("q-7");
    expect(ctx.attempt).toBe(3);
  });

  it("reports whole percents within 0..100, and a failed progress write never fails the job", async () => {
    const seen: number[] = [];
    const job = { id: "q-8", attemptsMade: 0, updateProgress: async (p: number) => void seen.push(p) } as unknown as Job;
    const ctx = jobContext(job, new AbortController().signal);
    for (const p of [-5, 12.4, 12.6, 140]) await ctx.progress!(p);
    expect(seen).toEqual([0, 12, 13, 100]);
    const failing = jobContext({ id: "q-9", attemptsMade: 0, updateProgress: () => Promise.reject(new Error("Redis away")) } as unknown as Job, new AbortController().signal);
    await expect(Promise.resolve(failing.progress!(50))).resolves.toBeUndefined();
  });

  it("the worker's table runs each handler with the job's payload: an aborted run of a periodic job does nothing", async () => {
    const aborted = AbortSignal.abort();
    const job = { id: "q-10", data: {}, attemptsMade: 0, updateProgress: async () => {} } as unknown as Job<never>;
    await expect(handlers["purge-uploads"](job, aborted)).resolves.toBeUndefined();
    await expect(handlers["custody-checkpoints"](job, aborted)).resolves.toBeUndefined();
  });
});
