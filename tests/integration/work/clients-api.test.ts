// The clients API against the real Postgres: authorization matrix, bad input, organisation isolation.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as list from "@/app/api/clients/route";
import * as one from "@/app/api/clients/[id]/route";
import { db, closeDb } from "@/db/client";
import { clients } from "@/db/schema";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeClient } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { roleMatrix } from "@/tests/support/role-matrix";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let otherOrgClientId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  otherOrgClientId = (await makeClient(actors.other!.organisationId, { name: "Other org client" })).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("authorization matrix", () => {
  roleMatrix(["list", "create"], { owner: [200, 201], pilot: [200, 403], reviewer: [200, 403], client: [200, 403], other: [200, 201], anonymous: [401, 401] }, async (who) => ({
    list: (await list.GET(await req(actors[who], "GET", "/api/clients"))).status,
    create: (await list.POST(await req(actors[who], "POST", "/api/clients", { name: `Made by ${who}` }))).status,
  }));

  it("a client of another organisation answers 404 to read, edit and archive", async () => {
    const owner = actors.owner;
    expect((await one.GET(await req(owner, "GET", "/x"), route({ id: otherOrgClientId }))).status).toBe(404);
    expect((await one.PATCH(await req(owner, "PATCH", "/x", { name: "Taken" }), route({ id: otherOrgClientId }))).status).toBe(404);
    expect((await one.DELETE(await req(owner, "DELETE", "/x"), route({ id: otherOrgClientId }))).status).toBe(404);
    const [row] = await db().select().from(clients).where(eq(clients.id, otherOrgClientId));
    expect(row.name).toBe("Other org client");
    expect(row.archivedAt).toBeNull();
  });

  it("the other organisation's list never shows this organisation's clients", async () => {
    const body = await (await list.GET(await req(actors.other, "GET", "/api/clients?pageSize=200"))).json();
    const [mine] = await db().select({ id: clients.id }).from(clients).where(eq(clients.organisationId, orgId)).limit(1);
    expect(body.items.map((c: { id: string }) => c.id)).not.toContain(mine.id);
  });
});

describe("bad input", () => {
  const bad: [string, unknown, number, string][] = [
    ["malformed JSON", "{name:", 400, "bad_request"],
    ["wrong type", { name: 42 }, 422, "unprocessable"],
    ["missing name", {}, 422, "unprocessable"],
    ["over-long name", { name: "x".repeat(121) }, 422, "unprocessable"],
    ["bad e-mail", { name: "Ok", contactEmail: "not-mail" }, 422, "unprocessable"],
  ];
  it.each(bad)("%s -> %i with the shared error body, nothing written", async (_label, body, status, code) => {
    const before = await db().$count(clients);
    const res = await list.POST(await req(actors.owner, "POST", "/api/clients", body));
    expect(res.status).toBe(status);
    const json = await res.json();
    expect(json.error.code).toBe(code);
    expect(typeof json.error.message).toBe("string");
    expect(await db().$count(clients)).toBe(before);
  });

  it("a <script> in a name is stored as plain text", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/clients", { name: "<script>alert(1)</script>" }));
    expect(res.status).toBe(201);
    const { id } = await res.json();
    const [row] = await db().select().from(clients).where(eq(clients.id, id));
    expect(row.name).toBe("<script>alert(1)</script>");
  });

  it("unknown and non-UUID ids answer 404, not 500", async () => {
    for (const id of ["00000000-0000-4000-8000-000000000000", "not-a-uuid", "1;DROP TABLE clients"]) {
      expect((await one.GET(await req(actors.owner, "GET", "/x"), route({ id }))).status).toBe(404);
    }
  });

  it("a search with LIKE wildcards matches them literally", async () => {
    await makeClient(orgId, { name: "Percent 50% client" });
    const body = await (await list.GET(await req(actors.owner, "GET", "/api/clients?q=50%25"))).json();
    expect(body.items.map((c: { name: string }) => c.name)).toEqual(["Percent 50% client"]);
  });
});
