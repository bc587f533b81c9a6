// GET /api/attention: what needs attention now for the signed-in member (the start page's numbers)
import { withOrg, ok } from "@/lib/api/with-org";
import { listAttention } from "@/lib/attention/list-attention";

export const GET = withOrg({ permission: "workspace.read" }, async ({ member }) => ok(await listAttention(member)));
