// GET /api/custody/export?format=csv|json[&recordingId=|&jobId=]: download a custody trail (or the
// organisation's whole log), streamed page by page
import { custodyExportQuery } from "@/lib/custody/custody-input";
import { withOrg, parseQuery } from "@/lib/api/with-org";
import { buildContentDisposition } from "@/lib/http/build-content-disposition";
import { custodyTrail, trailCondition } from "@/lib/custody/list-custody-events";
import { custodyCsvHeader, custodyCsvRow, custodyJsonEvent, HASH_RULE } from "@/lib/custody/export-custody-log";

export const GET = withOrg({ permission: "custody.read" }, async ({ req, member }) => {
  const q = parseQuery(req, custodyExportQuery);
  const filter = { recordingId: q.recordingId, jobId: q.jobId };
  await trailCondition(member.organisationId, filter); // 404 before the stream starts
  const scope = q.recordingId ? `recording-${q.recordingId}` : q.jobId ? `job-${q.jobId}` : "organisation";
  const stamp = new Date().toISOString().slice(0, 19).replace(/[:T]/g, "-");
  const encoder = new TextEncoder();
  const events = custodyTrail(member.organisationId, filter);
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      try {
        if (q.format === "csv") {
          controller.enqueue(encoder.encode(custodyCsvHeader()));
          for await (const e of events) controller.enqueue(encoder.encode(custodyCsvRow(e)));
        } else {
          const head = { organisation: { id: member.organisationId, name: member.organisationName }, scope, exportedAt: new Date().toISOString(), exportedBy: member.email, hashRule: HASH_RULE };
          controller.enqueue(encoder.encode(`${JSON.stringify(head).slice(0, -1)},"events":[`));
          let first = true;
          for await (const e of events) {
            controller.enqueue(encoder.encode(`${first ? "" : ","}\n${JSON.stringify(custodyJsonEvent(e))}`));
            first = false;
          }
          controller.enqueue(encoder.encode("\n]}\n"));
        }
        controller.close();
      } catch (err) {
        controller.error(err);
      }
    },
  });
  return new Response(body, {
    headers: {
      "Content-Type": q.format === "csv" ? "text/csv; charset=utf-8; header=present" : "application/json; charset=utf-8",
      "Content-Disposition": buildContentDisposition(`custody-${scope}-${stamp}.${q.format}`),
      "Cache-Control": "no-store",
    },
  });
});
