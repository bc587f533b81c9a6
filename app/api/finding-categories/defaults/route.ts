// POST /api/finding-categories/defaults: add the default categories the organisation lacks
import { withOrg, ok } from "@/lib/api/with-org";
import { restoreDefaultCategories } from "@/lib/findings/finding-categories";

export const POST = withOrg({ permission: "findings.write" }, async ({ member }) => ok(await restoreDefaultCategories(member.organisationId)));
