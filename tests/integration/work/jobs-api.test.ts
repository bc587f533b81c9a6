// The jobs API against the real Postgres: authorization matrix, site and crew references, bad input,
// filters and the job detail.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as list from "@/app/api/jobs/route";
import * as one from "@/app/api/jobs/[id]/route";
import { db, closeDb } from "@/db/client";
import { jobs } from "@/db/schema";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeClient, makeFlight, makeJob, makeSite, makeMember } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { crudRoleMatrix } from "@/tests/support/role-matrix";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let siteId: string;
let otherOrgSiteId: string;
let otherOrgJobId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  siteId = (await makeSite(orgId, { name: "Jobs test site", timeZone: "Europe/London" })).id;
  // the demo client account sees the jobs at this site's client (client-scope.test.ts covers the rest)
  await tieClientAccount(actors.client!, await clientOf({ siteId }));
  otherOrgSiteId = (await makeSite(actors.other!.organisationId, { name: "Other org site" })).id;
  otherOrgJobId = (await makeJob(actors.other!.organisationId, { siteId: otherOrgSiteId, title: "Other org job" })).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const countJobs = () => db().$count(jobs);

describe("authorization matrix", () => {
  crudRoleMatrix({
    path: "jobs",
    list,
    one,
    actors: () => actors,
    expected: {
      owner: [200, 201, 200, 200, 200],
      pilot: [200, 403, 200, 403, 403],
      reviewer: [200, 403, 200, 403, 403],
      client: [200, 403, 200, 403, 403],
      other: [200, 422, 404, 404, 404],
      anonymous: [401, 401, 401, 401, 401],
    },
    make: (who) => makeJob(orgId, { siteId, title: `Matrix job for ${who}` }),
    createBody: (who) => ({ siteId, title: `Made by ${who}` }),
    editBody: () => ({ status: "fieldwork" }),
    effects: async (who, id, want) => {
      expect(await db().$count(jobs, eq(jobs.title, `Made by ${who}`))).toBe(want.create === 201 ? 1 : 0);
      const [after] = await db().select().from(jobs).where(eq(jobs.id, id));
      expect(after.status).toBe(want.edit === 200 ? "fieldwork" : "planned");
      expect(after.archivedAt === null).toBe(want.archive !== 200);
    },
  });

  it("another organisation's job answers 404 to read, edit and archive, and stays as it was", async () => {
    const at = route({ id: otherOrgJobId });
    expect((await one.GET(await req(actors.owner, "GET", "/x"), at)).status).toBe(404);
    // even with a body that would be refused, the unknown job answers first
    expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { siteId: otherOrgSiteId }), at)).status).toBe(404);
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), at)).status).toBe(404);
    const [row] = await db().select().from(jobs).where(eq(jobs.id, otherOrgJobId));
    expect(row.title).toBe("Other org job");
    expect(row.archivedAt).toBeNull();
  });

  it("lists never show another organisation's jobs", async () => {
    const body = await (await list.GET(await req(actors.owner, "GET", "/api/jobs?pageSize=200"))).json();
    expect(body.items.map((j: { id: string }) => j.id)).not.toContain(otherOrgJobId);
  });
});

describe("site and crew references", () => {
  const refused: [string, () => Promise<Record<string, unknown>>, string, string][] = [
    ["a site of another organisation", async () => ({ siteId: otherOrgSiteId }), "siteId", "No such site in this organisation"],
    ["an unknown site", async () => ({ siteId: "00000000-0000-4000-8000-000000000000" }), "siteId", "No such site in this organisation"],
    ["a pilot from another organisation", async () => ({ siteId, pilotId: actors.other!.userId }), "pilotId", "Not a member of this organisation"],
    ["a reviewer as pilot", async () => ({ siteId, pilotId: actors.reviewer!.userId }), "pilotId", "The pilot must be a member with the role pilot or owner"],
    ["a client account as reviewer", async () => ({ siteId, reviewerId: actors.client!.userId }), "reviewerId", "The reviewer must be a member with the role reviewer or owner"],
    ["an unknown reviewer", async () => ({ siteId, reviewerId: "00000000-0000-4000-8000-000000000000" }), "reviewerId", "Not a member of this organisation"],
  ];
  it.each(refused)("%s is refused as a field error, nothing written", async (_label, make, field, message) => {
    const before = await countJobs();
    const res = await list.POST(await req(actors.owner, "POST", "/api/jobs", { title: "Refused", ...(await make()) }));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("unprocessable");
    expect(body.error.fields[field]).toEqual([message]);
    expect(await countJobs()).toBe(before);
  });

  it("an owner may fill both seats; a pilot and reviewer in their own roles are accepted", async () => {
    for (const crew of [
      { pilotId: actors.owner!.userId, reviewerId: actors.owner!.userId },
      { pilotId: actors.pilot!.userId, reviewerId: actors.reviewer!.userId },
    ]) {
      const res = await list.POST(await req(actors.owner, "POST", "/api/jobs", { siteId, title: "Crewed", ...crew }));
      expect(res.status).toBe(201);
      expect(await res.json()).toMatchObject(crew);
    }
  });

  it("re-assigning a job to another organisation's member changes nothing", async () => {
    const job = await makeJob(orgId, { siteId, pilotId: actors.pilot!.userId });
    const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", { pilotId: actors.other!.userId }), route({ id: job.id }));
    expect(res.status).toBe(422);
    const [row] = await db().select().from(jobs).where(eq(jobs.id, job.id));
    expect(row.pilotId).toBe(actors.pilot!.userId);
  });
});

describe("bad input", () => {
  const bad: [string, unknown, number, string | null][] = [
    ["malformed JSON", "{title:", 400, null],
    ["wrong type for title", { siteId: "__site__", title: ["x"] }, 422, "title"],
    ["empty title", { siteId: "__site__", title: "   " }, 422, "title"],
    ["over-long title", { siteId: "__site__", title: "t".repeat(161) }, 422, "title"],
    ["over-long scope", { siteId: "__site__", title: "x", scope: "s".repeat(4001) }, 422, "scope"],
    ["unknown status", { siteId: "__site__", title: "x", status: "done-ish" }, 422, "status"],
    ["due date not ISO", { siteId: "__site__", title: "x", dueDate: "14/03/2026" }, 422, "dueDate"],
    ["due date that does not exist", { siteId: "__site__", title: "x", dueDate: "2026-02-30" }, 422, "dueDate"],
    ["pilotId not a UUID", { siteId: "__site__", title: "x", pilotId: 7 }, 422, "pilotId"],
  ];
  it.each(bad)("%s -> %i with the shared error body, nothing written", async (_label, body, status, field) => {
    const before = await countJobs();
    const sent = typeof body === "object" ? JSON.parse(JSON.stringify(body).replace("__site__", siteId)) : body;
    const res = await list.POST(await req(actors.owner, "POST", "/api/jobs", sent));
    expect(res.status).toBe(status);
    const json = await res.json();
    expect(json.error.code).toBe(status === 400 ? "bad_request" : "unprocessable");
    if (field) expect(Object.keys(json.error.fields)).toContain(field);
    expect(await countJobs()).toBe(before);
  });

  it("a <script> in a title is stored as plain text", async () => {
    const res = await list.POST(await req(actors.owner, "POST", "/api/jobs", { siteId, title: "<script>alert(1)</script>" }));
    expect(res.status).toBe(201);
    const [row] = await db().select().from(jobs).where(eq(jobs.id, (await res.json()).id));
    expect(row.title).toBe("<script>alert(1)</script>");
  });

  it("a PATCH without a status keeps the status (no default creeps in)", async () => {
    const job = await makeJob(orgId, { siteId, status: "review" });
    const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", { title: "Retitled" }), route({ id: job.id }));
    expect(await res.json()).toMatchObject({ title: "Retitled", status: "review" });
  });

  it("unknown and non-UUID ids answer 404; bad filters 422; never 500", async () => {
    for (const id of ["00000000-0000-4000-8000-000000000000", "x", "' OR 1=1 --"]) {
      expect((await one.GET(await req(actors.owner, "GET", "/x"), route({ id }))).status).toBe(404);
    }
    for (const q of ["status=finished", "status=planned,bogus", "siteId=1", "pilotId=abc", "q=%00"]) {
      expect((await list.GET(await req(actors.owner, "GET", `/api/jobs?${q}`))).status, q).toBe(422);
    }
  });
});

describe("filters and detail", () => {
  it("?status= takes one or several statuses; ?siteId= and ?clientId= narrow to a place", async () => {
    const client = await makeClient(orgId, { name: "Job filter client" });
    const site = await makeSite(orgId, { clientId: client.id, name: "Job filter site" });
    await makeJob(orgId, { siteId: site.id, title: "F planned", status: "planned", dueDate: "2026-05-02" });
    await makeJob(orgId, { siteId: site.id, title: "F review", status: "review", dueDate: "2026-05-01" });
    await makeJob(orgId, { siteId: site.id, title: "F closed", status: "closed" });
    const titles = async (qs: string) =>
      ((await (await list.GET(await req(actors.owner, "GET", `/api/jobs?${qs}`))).json()).items as { title: string }[]).map((j) => j.title);
    expect(await titles(`siteId=${site.id}`)).toEqual(["F review", "F planned", "F closed"]); // due soonest first, undated last
    expect(await titles(`clientId=${client.id}&status=review`)).toEqual(["F review"]);
    expect(await titles(`clientId=${client.id}&status=planned,closed&sort=title`)).toEqual(["F closed", "F planned"]);
  });

  it("?pilotId= lists the jobs assigned to one pilot", async () => {
    const pilot = await makeMember(orgId, "pilot");
    await makeJob(orgId, { siteId, title: "Assigned to the new pilot", pilotId: pilot.userId });
    const body = await (await list.GET(await req(actors.pilot, "GET", `/api/jobs?pilotId=${pilot.userId}`))).json();
    expect(body.items.map((j: { title: string }) => j.title)).toEqual(["Assigned to the new pilot"]);
  });

  it("the list and the detail carry site, client, crew names and the flight count", async () => {
    const job = await makeJob(orgId, { siteId, title: "Detailed job", pilotId: actors.pilot!.userId, reviewerId: actors.reviewer!.userId, scope: "Roof and gutters" });
    await makeFlight(orgId, { jobId: job.id });
    await makeFlight(orgId, { jobId: job.id, archivedAt: new Date() });
    const body = await (await list.GET(await req(actors.client, "GET", "/api/jobs?q=Detailed%20job"))).json();
    expect(body.items).toHaveLength(1);
    expect(body.items[0]).toMatchObject({ siteName: "Jobs test site", siteTimeZone: "Europe/London", pilotName: "Bram Ellery", reviewerName: "Cleo Marchbank", flightCount: 1 });
    const detail = await (await one.GET(await req(actors.reviewer, "GET", "/x"), route({ id: job.id }))).json();
    expect(detail).toMatchObject({ title: "Detailed job", scope: "Roof and gutters", siteName: "Jobs test site", pilotName: "Bram Ellery" });
    expect(detail.clientName).toMatch(/^Test client/);
  });
});
