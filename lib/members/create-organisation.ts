// Creates an organisation and its first owner (user + owner membership) in one transaction: a failure
// at any step leaves no organisation, no user and no membership behind.
import "server-only";
import { db } from "@/db/client";
import { memberships, organisations, users } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { hashPassword } from "@/lib/auth/password";
import { organisationInput, type OrganisationInput } from "@/lib/validation/organisation";

const UNIQUE_VIOLATION = "23505"; // PostgreSQL SQLSTATE unique_violation

/** The PostgreSQL error behind a failed query (drizzle wraps the driver's error in `cause`). */
function pgError(err: unknown): { code?: string; constraint_name?: string } | undefined {
  for (let e = err as { code?: string; constraint_name?: string; cause?: unknown } | undefined, i = 0; e && i < 4; e = e.cause as typeof e, i++) {
    if (typeof e.code === "string" && /^[0-9A-Z]{5}$/.test(e.code)) return e;
  }
  return undefined;
}

export async function createOrganisation(raw: OrganisationInput) {
  const input = organisationInput.parse(raw);
  const passwordHash = await hashPassword(input.owner.password);
  try {
    return await db().transaction(async (tx) => {
      const [org] = await tx
        .insert(organisations)
        .values({ name: input.name, slug: input.slug, timeZone: input.timeZone })
        .returning({ id: organisations.id, name: organisations.name, slug: organisations.slug });
      const [user] = await tx
        .insert(users)
        .values({ email: input.owner.email, name: input.owner.name, passwordHash })
        .returning({ id: users.id, email: users.email });
      await tx.insert(memberships).values({ organisationId: org.id, userId: user.id, role: "owner" });
      return { organisation: org, owner: user };
    });
  } catch (err) {
    const pg = pgError(err);
    if (pg?.code === UNIQUE_VIOLATION) {
      if (pg.constraint_name?.includes("slug")) throw new ApiError("conflict", "That short name is taken", { slug: ["Already taken"] });
      if (pg.constraint_name?.includes("email")) throw new ApiError("conflict", "An account with that e-mail exists", { "owner.email": ["Already has an account"] });
    }
    throw err;
  }
}
