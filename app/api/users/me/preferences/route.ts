// GET/PATCH /api/users/me/preferences: the signed-in person's own display preferences (ft or m)
import { withOrg, readJson, ok } from "@/lib/api/with-org";
import { preferencesInput } from "@/lib/validation/range-checks";
import { setPreferredUnits } from "@/lib/range-checks/set-preferred-units";

// every member may read and set their own preferences, whatever their role
export const GET = withOrg({ permission: "workspace.read" }, async ({ member }) => ok({ preferredUnits: member.preferredUnits }));

export const PATCH = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await setPreferredUnits(member.userId, (await readJson(req, preferencesInput)).preferredUnits)),
);
