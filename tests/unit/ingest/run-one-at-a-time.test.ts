// OneAtATime: work for one key never overlaps and runs in the order asked; other keys run alongside;
// a failure is handed to its caller and does not stop the work queued behind it.
import { describe, expect, it } from "vitest";
import { OneAtATime } from "@/lib/uploads/run-one-at-a-time";

const later = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("OneAtATime", () => {
  it("never overlaps work of one key, keeps its order, and lets other keys run alongside", async () => {
    const gate = new OneAtATime();
    const log: string[] = [];
    let running = 0;
    let most = 0;
    const job = (key: string, name: string, ms: number) =>
      gate.run(key, async () => {
        running += key === "org-a" ? 1 : 0;
        most = Math.max(most, running);
        log.push(`start ${name}`);
        await later(ms);
        log.push(`end ${name}`);
        running -= key === "org-a" ? 1 : 0;
        return name;
      });
    const results = await Promise.all([job("org-a", "a1", 30), job("org-a", "a2", 5), job("org-b", "b1", 1), job("org-a", "a3", 1)]);
    expect(results).toEqual(["a1", "a2", "b1", "a3"]);
    expect(most).toBe(1);
    const a = log.filter((l) => l.endsWith("a1") || l.endsWith("a2") || l.endsWith("a3"));
    expect(a).toEqual(["start a1", "end a1", "start a2", "end a2", "start a3", "end a3"]);
    // b1 did not wait for a1
    expect(log.indexOf("end b1")).toBeLessThan(log.indexOf("end a1"));
    expect(gate.busyKeys).toBe(0);
  });

  it("hands a failure to its caller and still runs what was queued behind it", async () => {
    const gate = new OneAtATime();
    const failing = gate.run("k", async () => {
      await later(5);
      throw new Error("quota exceeded");
    });
    const next = gate.run("k", async () => "recorded");
    await expect(failing).rejects.toThrow("quota exceeded");
    await expect(next).resolves.toBe("recorded");
  });
});
