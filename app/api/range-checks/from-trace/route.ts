// POST /api/range-checks/from-trace: log the link event a signal-trace interval marks, at its start time
import { withOrg, readJson, created } from "@/lib/api/with-org";
import { rangeCheckFromTraceInput } from "@/lib/validation/range-checks";
import { createRangeCheckFromTrace } from "@/lib/range-checks/create-range-check-from-trace";

export const POST = withOrg({ permission: "rangechecks.write" }, async ({ req, member }) =>
  created(await createRangeCheckFromTrace(member, await readJson(req, rangeCheckFromTraceInput))),
);
