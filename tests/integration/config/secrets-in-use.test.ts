// The secrets the app signs with are its own: a session or media address signed with a value that
// was once written in the source is refused, and rotating the media key ends grants signed before.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { encode } from "next-auth/jwt";
import { closeDb } from "@/db/client";
import * as recordings from "@/app/api/recordings/route";
import * as mediaRoute from "@/app/api/s/media/[grant]/route";
import * as links from "@/app/api/share-links/route";
import * as manifestRoute from "@/app/api/s/[token]/manifest/route";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";
import { env, resetEnvCache } from "@/lib/config/env";
import { newSecretValue } from "@/lib/config/installation-secrets";
import { signMediaGrant } from "@/lib/sharing/media-grant";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";

// The fixed fallbacks that an earlier version of lib/config/env.ts used on local runs (anyone who
// read the source knew them).
const OLD_SESSION_SECRET = "cairn-local-development-secret-not-for-production";
const OLD_MEDIA_KEY = "cairn-local-media-signing-key-not-for-production";

let actors: Record<DemoActorKey, Actor>;
let job: Awaited<ReturnType<typeof makeSharedJob>>;

const media = (grant: string, headers: Record<string, string> = {}) =>
  mediaRoute.GET(new Request(`http://localhost/api/s/media/${grant}`, { headers }), route({ grant }));
const grantFor = (linkId: string, key: string) =>
  signMediaGrant({ linkId, kind: "playable", resourceId: job.recA.id, expiresAt: Math.floor(Date.now() / 1000) + 300 }, key);

beforeAll(async () => {
  actors = await demoActors();
  job = await makeSharedJob(await demoOrganisationId());
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("installation secrets in use", () => {
  it("a session cookie signed with the old published secret is not a session", async () => {
    const owner = actors.owner!;
    const forged = await encode({ token: { uid: owner.userId, org: owner.organisationId, sub: owner.userId }, secret: OLD_SESSION_SECRET });
    const res = await recordings.GET(new Request("http://localhost/api/recordings", { headers: { cookie: `next-auth.session-token=${forged}` } }));
    expect(res.status).toBe(401);
    // the same request with the installation's own secret is the owner's
    expect((await recordings.GET(await req(owner, "GET", "/api/recordings"))).status).toBe(200);
  });

  it("a media address signed with the old published key plays nothing behind a passcode-protected link", async () => {
    const created = await links.POST(await req(actors.owner, "POST", "/api/share-links", { label: "Passcode link", jobId: job.jobId, scope: "job", passcode: "kestrel-2026" }));
    expect(created.status).toBe(201);
    const { id } = await created.json();
    expect((await media(grantFor(id, OLD_MEDIA_KEY), { range: "bytes=0-99" })).status).toBe(404);
  });

  it("rotating the media key ends every grant signed with the old one", async () => {
    const created = await links.POST(await req(actors.owner, "POST", "/api/share-links", { label: "Open link", jobId: job.jobId, scope: "job" }));
    const { id, url } = await created.json();
    const token = new URL(url).pathname.split("/")[2];
    const grant = grantFor(id, env().MEDIA_SIGNING_KEY);
    expect((await media(grant, { range: "bytes=0-99" })).status).toBe(206);

    const before = process.env.MEDIA_SIGNING_KEY;
    process.env.MEDIA_SIGNING_KEY = newSecretValue();
    resetEnvCache();
    try {
      expect((await media(grant, { range: "bytes=0-99" })).status).toBe(404);
      // the shared page hands out fresh addresses signed with the new key, and those play
      const view = await (await manifestRoute.GET(new Request(`http://localhost/api/s/${token}/manifest`), route({ token }))).json();
      const fresh = (view.recordings[0].playableUrl as string).split("/").pop()!;
      expect((await media(fresh, { range: "bytes=0-99" })).status).toBe(206);
    } finally {
      if (before === undefined) delete process.env.MEDIA_SIGNING_KEY;
      else process.env.MEDIA_SIGNING_KEY = before;
      resetEnvCache();
    }
  });
});
