// The sites API against the real Postgres: authorization matrix, references across organisations,
// bad input, filters and paging.
import { tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as list from "@/app/api/sites/route";
import * as one from "@/app/api/sites/[id]/route";
import { db, closeDb } from "@/db/client";
import { sites } from "@/db/schema";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeClient, makeSite } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { crudRoleMatrix } from "@/tests/support/role-matrix";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let clientId: string;
let otherOrgClientId: string;
let otherOrgSiteId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  clientId = (await makeClient(orgId, { name: "Sites test client" })).id;
  // the demo client account sees this client's sites (client-scope.test.ts covers the rest)
  await tieClientAccount(actors.client!, clientId);
  const otherClient = await makeClient(actors.other!.organisationId, { name: "Other org client" });
  otherOrgClientId = otherClient.id;
  otherOrgSiteId = (await makeSite(actors.other!.organisationId, { clientId: otherClient.id, name: "Other org site" })).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const countSites = () => db().$count(sites);

describe("authorization matrix", () => {
  crudRoleMatrix({
    path: "sites",
    list,
    one,
    actors: () => actors,
    expected: {
      owner: [200, 201, 200, 200, 200],
      pilot: [200, 403, 200, 403, 403],
      reviewer: [200, 403, 200, 403, 403],
      client: [200, 403, 200, 403, 403],
      // another organisation's owner may write sites, but this organisation's client and site are unknown to it
      other: [200, 422, 404, 404, 404],
      anonymous: [401, 401, 401, 401, 401],
    },
    make: (who) => makeSite(orgId, { clientId, name: `Matrix site for ${who}` }),
    createBody: (who) => ({ clientId, name: `Made by ${who}` }),
    editBody: (who) => ({ name: `Renamed by ${who}` }),
    effects: async (who, id, want) => {
      expect(await db().$count(sites, eq(sites.name, `Made by ${who}`))).toBe(want.create === 201 ? 1 : 0);
      const [after] = await db().select().from(sites).where(eq(sites.id, id));
      expect(after.name).toBe(want.edit === 200 ? `Renamed by ${who}` : `Matrix site for ${who}`);
      expect(after.archivedAt === null).toBe(want.archive !== 200);
    },
  });

  it("another organisation's site answers 404 to read, edit and archive, and stays as it was", async () => {
    const at = route({ id: otherOrgSiteId });
    expect((await one.GET(await req(actors.owner, "GET", "/x"), at)).status).toBe(404);
    expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { name: "Taken" }), at)).status).toBe(404);
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), at)).status).toBe(404);
    const [row] = await db().select().from(sites).where(eq(sites.id, otherOrgSiteId));
    expect(row.name).toBe("Other org site");
    expect(row.archivedAt).toBeNull();
  });

  it("lists never show another organisation's sites", async () => {
    const body = await (await list.GET(await req(actors.owner, "GET", "/api/sites?pageSize=200"))).json();
    expect(body.items.map((s: { id: string }) => s.id)).not.toContain(otherOrgSiteId);
  });
});

describe("references", () => {
  it("a clientId of another organisation is refused as a field error, nothing written", async () => {
    const before = await countSites();
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", { clientId: otherOrgClientId, name: "Smuggled" }));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("unprocessable");
    expect(body.error.fields.clientId).toEqual(["No such client in this organisation"]);
    expect(await countSites()).toBe(before);
  });

  it("an unknown clientId is refused the same way", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", { clientId: "00000000-0000-4000-8000-000000000000", name: "Nowhere" }));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.clientId).toEqual(["No such client in this organisation"]);
  });

  it("moving a site to another organisation's client is refused and changes nothing", async () => {
    const site = await makeSite(orgId, { clientId });
    const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", { clientId: otherOrgClientId }), route({ id: site.id }));
    expect(res.status).toBe(422);
    const [row] = await db().select().from(sites).where(eq(sites.id, site.id));
    expect(row.clientId).toBe(clientId);
  });

  it("an organisationId in the body is ignored: the site lands in the caller's organisation", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", { clientId, name: "Org smuggle", organisationId: actors.other!.organisationId }));
    expect(res.status).toBe(201);
    const [row] = await db().select().from(sites).where(eq(sites.id, (await res.json()).id));
    expect(row.organisationId).toBe(orgId);
  });
});

describe("bad input", () => {
  const bad: [string, unknown, number, string, string | null][] = [
    ["malformed JSON", "{name:", 400, "bad_request", null],
    ["JSON that is not an object", "[1,2]", 422, "unprocessable", null],
    ["wrong type for name", { clientId: "__client__", name: 42 }, 422, "unprocessable", "name"],
    ["missing clientId", { name: "No client" }, 422, "unprocessable", "clientId"],
    ["clientId not a UUID", { clientId: "1; DROP TABLE sites", name: "x" }, 422, "unprocessable", "clientId"],
    ["over-long name", { clientId: "__client__", name: "x".repeat(121) }, 422, "unprocessable", "name"],
    ["over-long address", { clientId: "__client__", name: "x", address: "a".repeat(301) }, 422, "unprocessable", "address"],
    ["NUL character in a name", { clientId: "__client__", name: "a\u0000b" }, 422, "unprocessable", "name"],
    ["latitude out of range", { clientId: "__client__", name: "x", latitude: 91, longitude: 0 }, 422, "unprocessable", "latitude"],
    ["longitude as text", { clientId: "__client__", name: "x", latitude: 10, longitude: "east" }, 422, "unprocessable", "longitude"],
    ["latitude without longitude", { clientId: "__client__", name: "x", latitude: 54.4 }, 422, "unprocessable", "longitude"],
    ["unknown time zone", { clientId: "__client__", name: "x", timeZone: "Mars/Olympus_Mons" }, 422, "unprocessable", "timeZone"],
    ["unknown asset kind", { clientId: "__client__", name: "x", assetKind: "volcano" }, 422, "unprocessable", "assetKind"],
  ];
  it.each(bad)("%s -> %i with the shared error body, nothing written", async (_label, body, status, code, field) => {
    const before = await countSites();
    const sent = typeof body === "object" && body ? JSON.parse(JSON.stringify(body).replace("__client__", clientId)) : body;
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", sent));
    expect(res.status).toBe(status);
    const json = await res.json();
    expect(json.error.code).toBe(code);
    expect(typeof json.error.message).toBe("string");
    if (field) expect(Object.keys(json.error.fields)).toContain(field);
    expect(await countSites()).toBe(before);
  });

  it("a <script> in a name is stored as plain text", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", { clientId, name: "<script>alert(1)</script>" }));
    expect(res.status).toBe(201);
    const [row] = await db().select().from(sites).where(eq(sites.id, (await res.json()).id));
    expect(row.name).toBe("<script>alert(1)</script>");
  });

  it("a time zone is stored under its canonical IANA name", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/sites", { clientId, name: "Zone", timeZone: "europe/london" }));
    expect(res.status).toBe(201);
    expect((await res.json()).timeZone).toBe("Europe/London");
  });

  it("PATCH refuses unknown fields and a coordinate that would leave half a pair", async () => {
    const site = await makeSite(orgId, { clientId, latitude: 54.4, longitude: -2.6 });
    const at = route({ id: site.id });
    expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { organisationId: orgId }), at)).status).toBe(422);
    const half = await one.PATCH(await req(actors.owner, "PATCH", "/x", { latitude: null }), at);
    expect(half.status).toBe(422);
    expect((await half.json()).error.fields.latitude).toBeDefined();
    // one half changed, the other kept: still a pair
    const moved = await one.PATCH(await req(actors.owner, "PATCH", "/x", { latitude: 54.5 }), at);
    expect(moved.status).toBe(200);
    expect(await moved.json()).toMatchObject({ latitude: 54.5, longitude: -2.6 });
  });

  it("a PATCH that leaves out the time zone and kind keeps them", async () => {
    const site = await makeSite(orgId, { clientId, timeZone: "Europe/London", assetKind: "bridge" });
    const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", { name: "Only the name" }), route({ id: site.id }));
    expect(await res.json()).toMatchObject({ name: "Only the name", timeZone: "Europe/London", assetKind: "bridge" });
  });

  it("unknown and non-UUID ids answer 404, not 500", async () => {
    for (const id of ["00000000-0000-4000-8000-000000000000", "not-a-uuid", "1;DROP TABLE sites"]) {
      expect((await one.GET(await req(actors.owner, "GET", "/x"), route({ id }))).status).toBe(404);
      expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { name: "x" }), route({ id }))).status).toBe(404);
    }
  });

  it("bad filters are 422, never 500", async () => {
    for (const q of ["clientId=nope", "assetKind=volcano", "page=0", "pageSize=5000", "dir=sideways", "q=%00"]) {
      const res = await list.GET(await req(actors.owner, "GET", `/api/sites?${q}`));
      expect(res.status, q).toBe(422);
    }
  });
});

describe("filters, sorting, paging, archive", () => {
  it("?clientId= keeps one client's sites; sort and paging are stable", async () => {
    const c = await makeClient(orgId, { name: "Filter client" });
    for (const n of ["Charlie", "Alpha", "Bravo"]) await makeSite(orgId, { clientId: c.id, name: n });
    const all = await (await list.GET(await req(actors.owner, "GET", `/api/sites?clientId=${c.id}&sort=name&dir=desc`))).json();
    expect(all.total).toBe(3);
    expect(all.items.map((s: { name: string }) => s.name)).toEqual(["Charlie", "Bravo", "Alpha"]);
    expect(all.items[0]).toMatchObject({ clientId: c.id, clientName: "Filter client", jobCount: 0 });
    const page2 = await (await list.GET(await req(actors.owner, "GET", `/api/sites?clientId=${c.id}&sort=name&pageSize=2&page=2`))).json();
    expect(page2.total).toBe(3);
    expect(page2.items.map((s: { name: string }) => s.name)).toEqual(["Charlie"]);
  });

  it("search matches the client's name too", async () => {
    const c = await makeClient(orgId, { name: "Zephyrine Holdings" });
    await makeSite(orgId, { clientId: c.id, name: "Plain yard" });
    const body = await (await list.GET(await req(actors.owner, "GET", "/api/sites?q=zephyrine"))).json();
    expect(body.items.map((s: { name: string }) => s.name)).toEqual(["Plain yard"]);
  });

  it("DELETE archives: the site leaves the list, shows under ?archived=1 and comes back on restore", async () => {
    const site = await makeSite(orgId, { clientId, name: "Archive me" });
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id: site.id }))).status).toBe(200);
    const listed = async (archived: string) =>
      ((await (await list.GET(await req(actors.owner, "GET", `/api/sites?archived=${archived}&q=Archive%20me`))).json()).items as { id: string }[]).map((s) => s.id);
    expect(await listed("0")).not.toContain(site.id);
    expect(await listed("1")).toContain(site.id);
    expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { archived: false }), route({ id: site.id }))).status).toBe(200);
    expect(await listed("0")).toContain(site.id);
  });
});
