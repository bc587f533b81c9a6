// GET /api/recordings/:id/progress: processing state and percentage. JSON by default; with
// "Accept: text/event-stream" a server-sent event stream that reports every change until the
// recording is ready or failed (Postgres holds the progress the worker writes).
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { readProcessingProgress, type ProcessingProgress } from "@/lib/recordings/read-processing-progress";
import { RECORDING_NOT_FOUND } from "@/lib/recordings/request-reprocess";

type P = { id: string };
const POLL_MS = 1000; // the worker writes at most every 1.5 s
const MAX_STREAM_MS = 10 * 60_000; // 10 min; EventSource reconnects by itself

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ req, params, member }) => {
  const id = idParam(params.id, RECORDING_NOT_FOUND);
  await requireInScope(member, "recording", id, RECORDING_NOT_FOUND);
  const first = await readProcessingProgress(member.organisationId, id);
  if (!(req.headers.get("accept") ?? "").includes("text/event-stream")) return ok(first);

  const encoder = new TextEncoder();
  const isFinal = (p: ProcessingProgress) => p.state === "ready" || p.state === "failed";
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (p: ProcessingProgress) => controller.enqueue(encoder.encode(`event: progress\ndata: ${JSON.stringify(p)}\n\n`));
      let last = JSON.stringify(first);
      send(first);
      const end = Date.now() + MAX_STREAM_MS;
      while (!isFinal(JSON.parse(last)) && !req.signal.aborted && Date.now() < end) {
        await new Promise((r) => setTimeout(r, POLL_MS));
        const now = await readProcessingProgress(member.organisationId, id).catch(() => null);
        if (!now) break;
        const text = JSON.stringify(now);
        if (text !== last) {
          last = text;
          send(now);
        }
      }
      controller.close();
    },
  });
  return new Response(stream, {
    headers: { "Content-Type": "text/event-stream; charset=utf-8", "Cache-Control": "no-store", "X-Accel-Buffering": "no" },
  });
});
