// The authorization matrix, generated from the route list: every exported method of every
// app/api/**/route.ts must have a row here, so a new route (or a new method on an old one) without
// an entry fails this test. Each row names the status every actor gets:
//   anonymous, client, pilot, reviewer, owner (of the organisation that holds the record), other
//   (the owner of another organisation).
// Reads use real records of the demo organisation, so the owner's 200 and the other owner's 404 are
// both shown. Writes send a body that fails validation (or name a record that does not exist), so an
// actor who passes the permission gate gets 422/404 and nothing changes, whichever order the rows run.
// Run with MATRIX_PRINT=1 to print what each actor gets (when adding a row).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { demoActors, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { changedTables, dbFingerprint } from "@/tests/support/db-fingerprint";
import { ACTORS, MATRIX, discoverRoutes, makeMatrixFixture, matrixRequest, type Fixture } from "./authorization-matrix-rows";

let actors: Record<DemoActorKey, Actor>;
let fx: Fixture;

beforeAll(async () => {
  actors = await demoActors();
  fx = await makeMatrixFixture(actors.owner);
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("authorization matrix from the route list", () => {
  it("every exported method of every app/api route has a row, and every row names a real route", async () => {
    const found = (await discoverRoutes()).map((r) => r.key).sort();
    const missing = found.filter((k) => !(k in MATRIX));
    const stale = Object.keys(MATRIX).filter((k) => !found.includes(k));
    expect(missing, "routes without a row in MATRIX").toEqual([]);
    expect(stale, "rows for routes that no longer exist").toEqual([]);
    expect(found.length).toBeGreaterThan(80);
  });

  it("each actor gets the status of its row, and nothing is written", async () => {
    const routes = await discoverRoutes();
    const got: Record<string, string> = {};
    const wrong: string[] = [];
    const before = await dbFingerprint();
    for (const { key, handler } of routes) {
      const row = MATRIX[key];
      if (!row || row.skip) continue;
      const method = key.split(" ")[0];
      const statuses: number[] = [];
      for (const who of ACTORS) {
        const res = await handler(await matrixRequest(row, method, actors[who], fx), route(row.params?.(fx) ?? {}));
        statuses.push(res.status);
        await res.arrayBuffer().catch(() => null);
      }
      got[key] = statuses.join(" ");
      if (got[key] !== row.expect) wrong.push(`${key}: expected ${row.expect}, got ${got[key]}`);
    }
    if (process.env.MATRIX_PRINT) console.log(Object.entries(got).map(([k, v]) => `${k.padEnd(48)} ${v}`).join("\n"));
    expect(wrong).toEqual([]);
    // downloads and refused deletions are custody events by design: every other table is untouched
    const changed = changedTables(before, await dbFingerprint()).filter((t) => !["custody_events"].includes(t));
    expect(changed).toEqual([]);
  });
});
