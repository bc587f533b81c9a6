// GET/PATCH/DELETE /api/findings/:id: read, edit (kept as a new version) or delete (recorded, not erased) a finding
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { notFound } from "@/lib/api/errors";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { deleteFindingInput, updateFindingInput } from "@/lib/findings/finding-input";
import { updateFinding } from "@/lib/findings/update-finding";
import { deleteFinding } from "@/lib/findings/delete-finding";
import { loadFindingView } from "@/lib/findings/finding-view";

type P = { id: string };

export const GET = withOrg<P>({ permission: "findings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Finding not found");
  await requireInScope(member, "finding", id, "Finding not found");
  const view = await loadFindingView(member.organisationId, id);
  if (!view) throw notFound("Finding not found");
  return ok(view);
});

export const PATCH = withOrg<P>({ permission: "findings.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Finding not found");
  const input = await readJson(req, updateFindingInput);
  return ok(await updateFinding(member.organisationId, id, input, { userId: member.userId, role: member.role, ...requestFacts(req) }));
});

export const DELETE = withOrg<P>({ permission: "findings.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Finding not found");
  // a reason is optional; a DELETE without a body is the common case
  const { reason } = (await req.clone().text()).trim() ? await readJson(req, deleteFindingInput) : { reason: undefined };
  return ok(await deleteFinding(member.organisationId, id, { userId: member.userId, role: member.role, ...requestFacts(req) }, reason || null));
});
