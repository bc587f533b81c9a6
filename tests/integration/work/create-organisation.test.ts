// Creating an organisation with its owner is all or nothing: a failure at any step leaves no
// organisation, no user and no membership behind.
import { afterAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import bcrypt from "bcryptjs";
import { ZodError } from "zod";
import * as clientsApi from "@/app/api/clients/route";
import { db, closeDb } from "@/db/client";
import { memberships, organisations, users } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { ApiError } from "@/lib/api/errors";
import { createOrganisation } from "@/lib/members/create-organisation";
import { req } from "@/tests/support/session";

afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const tag = () => randomUUID().slice(0, 8);
const counts = async () => ({ organisations: await db().$count(organisations), users: await db().$count(users), memberships: await db().$count(memberships) });
const input = (over: { slug?: string; email?: string } = {}) => {
  const t = tag();
  return { name: `Fellside Survey ${t}`, slug: over.slug ?? `fellside-${t}`, timeZone: "Europe/London", owner: { email: over.email ?? `owner-${t}@test.example`, name: "Orla Fellside", password: "a long enough password" } };
};

describe("createOrganisation", () => {
  it("creates the organisation, the owner's account and the owner membership together", async () => {
    const before = await counts();
    const made = input();
    const { organisation, owner } = await createOrganisation(made);
    expect(await counts()).toEqual({ organisations: before.organisations + 1, users: before.users + 1, memberships: before.memberships + 1 });
    const [m] = await db().select().from(memberships).where(eq(memberships.userId, owner.id));
    expect(m).toMatchObject({ organisationId: organisation.id, role: "owner" });
    const [u] = await db().select().from(users).where(eq(users.id, owner.id));
    expect(await bcrypt.compare("a long enough password", u.passwordHash!)).toBe(true);
    // the new owner works in an empty organisation of their own
    const res = await clientsApi.GET(await req({ userId: owner.id, organisationId: organisation.id }, "GET", "/api/clients"));
    expect(await res.json()).toEqual({ items: [], total: 0, totalIsLowerBound: false, nextCursor: null });
  });

  it("a duplicate owner e-mail fails after the organisation row was inserted, and the organisation is rolled back", async () => {
    const first = input();
    await createOrganisation(first);
    const before = await counts();
    const second = input({ email: first.owner.email });
    // the organisation insert comes first in the transaction, the user insert then violates users_email_unique
    const err = await createOrganisation(second).catch((e) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err.code).toBe("conflict");
    expect(err.fields).toEqual({ "owner.email": ["Already has an account"] });
    expect(await db().$count(organisations, eq(organisations.slug, second.slug))).toBe(0);
    expect(await counts()).toEqual(before);
  });

  it("a duplicate slug leaves no user and no membership", async () => {
    const first = input();
    await createOrganisation(first);
    const before = await counts();
    const second = input({ slug: first.slug });
    const err = await createOrganisation(second).catch((e) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err.fields).toEqual({ slug: ["Already taken"] });
    expect(await db().$count(users, eq(users.email, second.owner.email))).toBe(0);
    expect(await counts()).toEqual(before);
  });

  it("invalid input is refused before anything is written", async () => {
    const before = await counts();
    for (const bad of [
      { ...input(), slug: "Not A Slug!" },
      { ...input(), timeZone: "Atlantis/Capital" },
      { ...input(), owner: { email: "nope", name: "N", password: "a long enough password" } },
      { ...input(), owner: { email: "x@test.example", name: "N", password: "short" } },
    ]) {
      await expect(createOrganisation(bad)).rejects.toBeInstanceOf(ZodError);
    }
    expect(await counts()).toEqual(before);
  });
});
