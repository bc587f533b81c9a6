// GET /api/clients: list the organisation's clients; POST /api/clients: create one
import { clients } from "@/db/schema";
import { clientScopeCondition } from "@/lib/auth/client-scope";
import { withOrg, readJson, parseQuery, listQuery, created, ok } from "@/lib/api/with-org";
import { clientInput } from "@/lib/validation/work";
import { createClient, listClients } from "@/lib/filing/clients";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await listClients(member.organisationId, parseQuery(req, listQuery), clientScopeCondition(member, clients.id))),
);

export const POST = withOrg({ permission: "clients.write" }, async ({ req, member }) =>
  created(await createClient(member.organisationId, await readJson(req, clientInput))),
);
