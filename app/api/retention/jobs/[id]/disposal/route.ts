// POST /api/retention/jobs/:id/disposal {confirmTitle}: an owner confirms the disposal of a closed job's
// evidence once it is due (refused under legal hold, before the date, or without the exact title)
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { disposalInput } from "@/lib/validation/retention";
import { disposeJob } from "@/lib/retention/dispose-job";

type P = { id: string };

export const POST = withOrg<P>({ permission: "retention.manage" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Job not found");
  return ok(await disposeJob(member, id, await readJson(req, disposalInput), requestFacts(req)));
});
