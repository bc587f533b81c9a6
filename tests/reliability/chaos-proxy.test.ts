// The fault suite's own proxy must never be the fault: when the server stops reading for a moment
// (it is waiting for PostgreSQL, say) and catches up while the proxy is in its per-piece pause, the
// proxy must still pass the rest of the body on. It used to wait for a "drain" event that had already
// fired during the pause, so the client stayed paused for good: one upload of five in the
// database-outage test stopped mid-chunk after recovery.
import { afterEach, describe, expect, it } from "vitest";
import net from "node:net";
import type { AddressInfo } from "node:net";
import { startChaosProxy, type ChaosProxy } from "./support/chaos-proxy";

let proxy: ChaosProxy | undefined;
let upstream: net.Server | undefined;
afterEach(async () => {
  await proxy?.close();
  await new Promise<void>((r) => (upstream ? upstream.close(() => r()) : r()));
});

describe("chaos proxy", () => {
  it("passes a whole body on when the server catches up during the proxy's pause", async () => {
    const total = 1024 * 1024; // 16 pieces of 64 KiB: about 3 s of pauses
    let received = 0;
    let done!: () => void;
    const all = new Promise<void>((r) => (done = r));
    // a server that reads nothing for 20 ms after each connection opens, then everything at once
    upstream = net.createServer((s) => {
      s.pause();
      setTimeout(() => s.resume(), 20);
      s.on("data", (c: Buffer) => {
        received += c.length;
        if (received >= total) done();
      });
    });
    await new Promise<void>((r) => upstream!.listen(0, "127.0.0.1", () => r()));
    const targetPort = (upstream.address() as AddressInfo).port;
    // the pause (200 ms) outlasts the server's stall, so the upstream drains during the pause
    proxy = await startChaosProxy({ listenPort: 0, targetPort, cutRate: 0, minBytes: 0, maxBytes: 0, delayPerChunkMs: 200 });
    const client = net.connect(proxy.port, "127.0.0.1");
    await new Promise<void>((r) => client.once("connect", () => r()));
    client.write(Buffer.alloc(total, 7));
    const outcome = await Promise.race([all.then(() => "all bytes"), new Promise<string>((r) => setTimeout(() => r(`stalled at ${received} of ${total} bytes`), 15_000).unref())]);
    client.destroy();
    expect(outcome).toBe("all bytes");
  });
});
