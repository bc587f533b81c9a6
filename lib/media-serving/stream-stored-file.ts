// A stored file (or a byte range of it) as a web stream with backpressure. Players abort requests on
// every seek: cancelling the stream, or the request's abort signal, closes the file quietly. That is
// routine, not an error, so nothing is logged for it.
import "server-only";
import type { Readable } from "node:stream";
import { readKey } from "@/lib/storage/store";

export function streamStoredFile(key: string, range: { start: number; end: number } | undefined, signal?: AbortSignal): { stream: ReadableStream<Uint8Array>; file: Readable } {
  const file = readKey(key, range);
  let done = false;
  const finish = () => {
    done = true;
    if (!file.destroyed) file.destroy();
  };
  const onAbort = () => finish();
  signal?.addEventListener("abort", onAbort, { once: true });

  const stream = new ReadableStream<Uint8Array>(
    {
      start(controller) {
        file.on("data", (chunk) => {
          if (done) return;
          const bytes = typeof chunk === "string" ? new TextEncoder().encode(chunk) : new Uint8Array(chunk.buffer, chunk.byteOffset, chunk.byteLength);
          controller.enqueue(bytes);
          if ((controller.desiredSize ?? 1) <= 0) file.pause();
        });
        file.on("end", () => {
          if (done) return;
          done = true;
          signal?.removeEventListener("abort", onAbort);
          controller.close();
        });
        file.on("error", (err) => {
          if (done) return;
          done = true;
          signal?.removeEventListener("abort", onAbort);
          controller.error(err);
        });
        file.pause();
      },
      pull() {
        if (!done) file.resume();
      },
      cancel() {
        signal?.removeEventListener("abort", onAbort);
        finish();
      },
    },
    { highWaterMark: 4 }, // chunks of 64 KiB: about 256 KiB buffered ahead of a slow client
  );
  return { stream, file };
}
