// GET/HEAD /api/reports/:id/download: a built report's PDF as a download (Range supported), logged in the custody chain
import { handleMediaRequest } from "@/lib/media-serving/handle-media-request";
import { idParam } from "@/lib/api/with-org";
import { recordCustodyEvent, requestFacts } from "@/lib/custody/record-custody-event";
import { countsAsDownload } from "@/lib/custody/counts-as-download";

type Ctx = { params: Promise<{ id: string }> };
async function handle(req: Request, ctx: Ctx) {
  const { id } = await ctx.params;
  return handleMediaRequest(req, () => ({ kind: "report", reportId: idParam(id, "Report not found").toLowerCase() }), {
    disposition: "attachment",
    async onServed({ file, principal }, res) {
      // one custody entry per download, not per range request of a resuming client
      if (!countsAsDownload(req.method, res.status, res.headers.get("content-range"))) return;
      await recordCustodyEvent({
        organisationId: file.organisationId,
        eventType: "download",
        evidenceType: "report",
        evidenceId: file.id,
        jobId: file.jobId,
        actor: { userId: principal.userId, role: principal.role },
        ...requestFacts(req),
        outputSha256: file.sha256,
        purpose: "report download",
      });
    },
  });
}

export const GET = handle;
export const HEAD = handle;
