// GET/PATCH/DELETE /api/jobs/:id: read (with site, client and crew), edit, archive one job
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { jobPatch } from "@/lib/validation/work";
import { getJobOrThrow, updateJob } from "@/lib/filing/jobs";

type P = { id: string };
const NOT_FOUND = "Job not found";

export const GET = withOrg<P>({ permission: "workspace.read" }, async ({ params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "job", id, NOT_FOUND);
  return ok(await getJobOrThrow(member.organisationId, id));
}
);

export const PATCH = withOrg<P>({ permission: "jobs.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  return ok(await updateJob(member.organisationId, id, await readJson(req, jobPatch)));
});

export const DELETE = withOrg<P>({ permission: "jobs.write" }, async ({ params, member }) =>
  ok(await updateJob(member.organisationId, idParam(params.id, NOT_FOUND), { archived: true })),
);
