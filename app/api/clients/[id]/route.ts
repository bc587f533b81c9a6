// GET/PATCH/DELETE /api/clients/:id: read, edit, archive one client (DELETE archives; nothing is erased)
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { clientPatch } from "@/lib/validation/work";
import { getClientOrThrow, updateClient } from "@/lib/filing/clients";

type P = { id: string };

export const GET = withOrg<P>({ permission: "workspace.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Client not found");
  await requireInScope(member, "client", id, "Client not found");
  return ok(await getClientOrThrow(member.organisationId, id));
}
);

export const PATCH = withOrg<P>({ permission: "clients.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Client not found");
  return ok(await updateClient(member.organisationId, id, await readJson(req, clientPatch)));
});

export const DELETE = withOrg<P>({ permission: "clients.write" }, async ({ params, member }) =>
  ok(await updateClient(member.organisationId, idParam(params.id, "Client not found"), { archived: true })),
);
