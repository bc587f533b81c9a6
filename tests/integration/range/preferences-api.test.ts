// The ft/m preference: each person sets their own, whatever their role.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as prefs from "@/app/api/users/me/preferences/route";
import { db, closeDb } from "@/db/client";
import { users } from "@/db/schema";
import { demoActors, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";

let actors: Record<DemoActorKey, Actor>;
const unitsOf = async (who: DemoActorKey) => (await db().select({ u: users.preferredUnits }).from(users).where(eq(users.id, actors[who]!.userId)))[0].u;

beforeAll(async () => {
  actors = await demoActors();
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("/api/users/me/preferences", () => {
  it.each(["owner", "pilot", "reviewer", "client"] as DemoActorKey[])("%s sets and reads back their own units", async (who) => {
    const res = await prefs.PATCH(await req(actors[who], "PATCH", "/x", { preferredUnits: "m" }));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ preferredUnits: "m" });
    expect(await unitsOf(who)).toBe("m");
    expect(await (await prefs.GET(await req(actors[who], "GET", "/x"))).json()).toEqual({ preferredUnits: "m" });
    await prefs.PATCH(await req(actors[who], "PATCH", "/x", { preferredUnits: "ft" }));
    expect(await unitsOf(who)).toBe("ft");
  });

  it("changes only the caller's preference", async () => {
    await prefs.PATCH(await req(actors.pilot, "PATCH", "/x", { preferredUnits: "m" }));
    expect(await unitsOf("owner")).toBe("ft");
    await prefs.PATCH(await req(actors.pilot, "PATCH", "/x", { preferredUnits: "ft" }));
  });

  it.each([[{ preferredUnits: "yd" }], [{}], [{ preferredUnits: "m", role: "owner" }]])("refuses %j with 422, nothing changed", async (b) => {
    const res = await prefs.PATCH(await req(actors.owner, "PATCH", "/x", b));
    expect(res.status).toBe(422);
    expect(await unitsOf("owner")).toBe("ft");
  });

  it("anonymous -> 401", async () => {
    expect((await prefs.PATCH(await req(null, "PATCH", "/x", { preferredUnits: "m" }))).status).toBe(401);
    expect((await prefs.GET(await req(null, "GET", "/x"))).status).toBe(401);
  });
});
