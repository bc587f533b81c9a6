// GET /api/custody?recordingId= | ?jobId=: the custody trail of a recording or a job, in chain order
import { z } from "zod";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listCustodyEvents } from "@/lib/custody/list-custody-events";

const query = z.object({
  recordingId: z.string().uuid().optional(),
  jobId: z.string().uuid().optional(),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});

export const GET = withOrg({ permission: "custody.read" }, async ({ req, member }) => {
  const q = parseQuery(req, query);
  return ok(await listCustodyEvents(member.organisationId, { recordingId: q.recordingId, jobId: q.jobId }, q.page, q.pageSize));
});
