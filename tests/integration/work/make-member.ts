// Adds a throw-away member to an organisation, for tests that change roles or remove people.
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import { memberships, users } from "@/db/schema";
import type { Role } from "@/db/schema/types";

export async function makeMember(organisationId: string, role: Role, over: { email?: string; name?: string; passwordHash?: string | null } = {}) {
  const tag = randomUUID().slice(0, 8);
  const [user] = await db()
    .insert(users)
    .values({ email: over.email ?? `${role}-${tag}@test.example`, name: over.name ?? `Test ${role} ${tag}`, passwordHash: over.passwordHash ?? null })
    .returning();
  await db().insert(memberships).values({ organisationId, userId: user.id, role });
  return { userId: user.id, organisationId, email: user.email, name: user.name };
}
