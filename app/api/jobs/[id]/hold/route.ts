// GET /api/jobs/:id/hold: whether the job is under legal hold; PUT: set or release it, each with a reason
import { requireInScope } from "@/lib/auth/client-scope";
import { legalHoldInput } from "@/lib/validation/legal-hold";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { getLegalHold, setLegalHold } from "@/lib/custody/set-legal-hold";

type P = { id: string };

export const GET = withOrg<P>({ permission: "workspace.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Job not found");
  await requireInScope(member, "job", id, "Job not found");
  return ok(await getLegalHold(member.organisationId, id));
}
);

export const PUT = withOrg<P>({ permission: "holds.manage" }, async ({ req, params, member }) =>
  ok(await setLegalHold(member, idParam(params.id, "Job not found"), await readJson(req, legalHoldInput), requestFacts(req))),
);
