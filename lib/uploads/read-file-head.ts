// The first bytes of a file, for content sniffing; never more than `limit` bytes in memory.
import "server-only";
import { open } from "node:fs/promises";

export async function readFileHead(file: string, limit: number): Promise<Uint8Array> {
  const fh = await open(file, "r");
  try {
    const buf = Buffer.alloc(limit);
    let filled = 0;
    while (filled < limit) {
      const { bytesRead } = await fh.read(buf, filled, limit - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
    }
    return buf.subarray(0, filled);
  } finally {
    await fh.close();
  }
}
