// POST /api/findings/:id/still: extract the finding's still again (after a failure, or when it stayed pending)
import { withOrg, idParam, created } from "@/lib/api/with-org";
import { requestStillAgain } from "@/lib/findings/request-still-again";

type P = { id: string };

export const POST = withOrg<P>({ permission: "findings.write" }, async ({ params, member }) =>
  created(await requestStillAgain(member.organisationId, idParam(params.id, "Finding not found"))),
);
