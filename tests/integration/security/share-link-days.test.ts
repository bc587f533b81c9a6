// A share link's lifetime must be a number of days: JSON `true`, `false`, "" or `[3]` are refused
// (422 naming expiresInDays), not coerced to 1 or 0 and saved.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as shareLinks from "@/app/api/share-links/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";

let actors: Record<DemoActorKey, Actor>;
let jobId: string;

beforeAll(async () => {
  actors = await demoActors();
  jobId = (await makeSharedJob(await demoOrganisationId())).jobId;
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

const post = async (expiresInDays: unknown) =>
  shareLinks.POST(await req(actors.owner, "POST", "/api/share-links", { jobId, scope: "job", label: "Days", sendMail: false, expiresInDays }));

describe("expiresInDays", () => {
  it("refuses booleans, empty text, arrays and fractions with 422 naming the field, saving nothing", async () => {
    const before = await db().$count(s.shareLinks);
    for (const bad of [true, false, "", " ", [3], "3 days", 2.5, 0, 91]) {
      const res = await post(bad);
      expect(res.status, JSON.stringify(bad)).toBe(422);
      expect((await res.json()).error.fields.expiresInDays, JSON.stringify(bad)).toBeDefined();
    }
    expect(await db().$count(s.shareLinks)).toBe(before);
  });

  it("takes a number, digits from the form, or nothing (14 days)", async () => {
    for (const [days, want] of [[7, 7], ["30", 30], [undefined, 14]] as const) {
      const res = await post(days);
      expect(res.status, String(days)).toBe(201);
      const body = await res.json();
      const expires = new Date(body.expiresAt ?? body.link?.expiresAt).getTime();
      expect(Math.round((expires - Date.now()) / 86_400_000)).toBe(want);
    }
  });
});
