// GET/PATCH/DELETE /api/range-checks/:id: read, edit (slant range recomputed), archive one range check
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { rangeCheckPatchInput } from "@/lib/validation/range-checks";
import { archiveRangeCheck, getRangeCheckOrThrow, updateRangeCheck } from "@/lib/range-checks/range-checks";

type P = { id: string };

export const GET = withOrg<P>({ permission: "range.read" }, async ({ params, member }) =>
  ok(await getRangeCheckOrThrow(member.organisationId, idParam(params.id, "Range check not found"))),
);

export const PATCH = withOrg<P>({ permission: "rangechecks.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Range check not found");
  return ok(await updateRangeCheck(member, id, await readJson(req, rangeCheckPatchInput)));
});

export const DELETE = withOrg<P>({ permission: "rangechecks.write" }, async ({ params, member }) =>
  ok(await archiveRangeCheck(member.organisationId, idParam(params.id, "Range check not found"))),
);
