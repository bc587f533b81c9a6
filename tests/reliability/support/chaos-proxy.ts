// A TCP proxy of our own (node:net) between the upload clients and the server that cuts connections:
// each new connection is, with probability `cutRate`, destroyed on both sides after a random number of
// bytes from the client (between `minBytes` and `maxBytes`), mid-request and mid-body alike. Counts
// what it did, so the suite can report connections cut.
import net from "node:net";
import type { AddressInfo } from "node:net";

export type ChaosProxy = {
  port: number;
  stats: { connections: number; cut: number; refused: number };
  /** stop cutting (the last part of a run, so it can finish) */
  calm: () => void;
  close: () => Promise<void>;
};

export async function startChaosProxy(opts: {
  listenPort: number;
  targetPort: number;
  cutRate: number;
  minBytes: number;
  maxBytes: number;
  /** a pause after each piece the client sends, so uploads last long enough to be caught mid-way */
  delayPerChunkMs?: number;
  random?: () => number;
}): Promise<ChaosProxy> {
  const random = opts.random ?? Math.random;
  const stats = { connections: 0, cut: 0, refused: 0 };
  let calm = false;
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    stats.connections++;
    sockets.add(client);
    const upstream = net.connect(opts.targetPort, "127.0.0.1");
    sockets.add(upstream);
    const cutAfter = !calm && random() < opts.cutRate ? opts.minBytes + Math.floor(random() * (opts.maxBytes - opts.minBytes)) : Infinity;
    let forwarded = 0;
    const cut = () => {
      client.destroy();
      upstream.destroy();
    };
    client.on("data", (chunk: Buffer) => {
      if (forwarded + chunk.length >= cutAfter) {
        // forward the part before the cut point, then drop both sides without a goodbye
        upstream.write(chunk.subarray(0, Math.max(0, cutAfter - forwarded)));
        stats.cut++;
        cut();
        return;
      }
      forwarded += chunk.length;
      const flowing = upstream.write(chunk);
      if (opts.delayPerChunkMs) {
        client.pause();
        // after the pause, wait for "drain" only if the upstream still needs it: a drain that fired
        // during the pause would otherwise never come again, and the client would stay paused for good
        setTimeout(() => (upstream.writableNeedDrain ? upstream.once("drain", () => client.resume()) : client.resume()), opts.delayPerChunkMs);
      } else if (!flowing) {
        client.pause();
        upstream.once("drain", () => client.resume());
      }
    });
    upstream.on("data", (chunk: Buffer) => {
      if (!client.write(chunk)) {
        upstream.pause();
        client.once("drain", () => upstream.resume());
      }
    });
    client.on("end", () => upstream.end());
    upstream.on("end", () => client.end());
    upstream.on("error", (err: NodeJS.ErrnoException) => {
      if (err.code === "ECONNREFUSED") stats.refused++;
      client.destroy();
    });
    client.on("error", () => upstream.destroy());
    // one side gone for good: so is the other (as a reverse proxy does), or a paused client socket
    // would wait forever for an answer from an upstream that has closed
    client.on("close", () => {
      sockets.delete(client);
      upstream.destroy();
    });
    upstream.on("close", () => {
      sockets.delete(upstream);
      client.destroy();
    });
  });
  await new Promise<void>((resolve) => server.listen(opts.listenPort, "127.0.0.1", resolve));
  return {
    port: (server.address() as AddressInfo).port,
    stats,
    calm: () => {
      calm = true;
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const s of sockets) s.destroy();
        server.close(() => resolve());
      }),
  };
}
