// POST /api/custody/verify: recompute the organisation's whole custody chain and name the first
// broken event, if any; with signed checkpoints, say up to which one the log is proven complete
// (`anchor`) or which checkpoint does not hold
import { withOrg, ok } from "@/lib/api/with-org";
import { verifyOrganisationChain, describeBreak } from "@/lib/custody/verify-organisation-chain";

export const POST = withOrg({ permission: "custody.read" }, async ({ member }) => {
  const result = await verifyOrganisationChain(member.organisationId);
  return ok(result.ok ? result : { ...result, explanation: describeBreak(result.reason) });
});
