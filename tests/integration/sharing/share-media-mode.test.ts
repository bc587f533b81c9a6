// The share-link mode plugged into the review room's media authorization (lib/media-access):
// signed grants open exactly the file they name, inside the link's scope, until the link is
// revoked or expires; the session mode is untouched.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { authorizeMedia } from "@/lib/media-access/authorize-media";
import type { MediaTarget } from "@/lib/media-access/media-file";
import { shareLinkMediaAccess } from "@/lib/sharing/share-link-media-access";
import { signMediaGrant, type MediaGrantKind } from "@/lib/sharing/media-grant";
import { hashShareToken, generateShareToken } from "@/lib/sharing/share-token";
import { ApiError } from "@/lib/api/errors";
import { env } from "@/lib/config/env";
import { closeRedis } from "@/lib/queue/redis";
import { demoOrganisationId } from "@/tests/support/session";
import { makeSharedJob } from "./share-fixtures";

let orgId: string;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let linkId: string;

const grant = (kind: MediaGrantKind, resourceId: string, expiresAt = Math.floor(Date.now() / 1000) + 300, link = linkId) =>
  signMediaGrant({ linkId: link, kind, resourceId, expiresAt }, env().MEDIA_SIGNING_KEY);
const authorize = (target: MediaTarget, token: string, headers: Record<string, string> = {}) =>
  authorizeMedia(new Request(`http://localhost/api/media/x?token=${token}`, { headers }), target, null, [shareLinkMediaAccess]);
const codeOf = (p: Promise<unknown>) => p.then(() => "ok", (e) => (e instanceof ApiError ? e.code : String(e)));
const playable = (recordingId: string): MediaTarget => ({ kind: "recording-file", recordingId, file: "playable.mp4" });

beforeAll(async () => {
  orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  const [link] = await db()
    .insert(s.shareLinks)
    .values({
      organisationId: orgId,
      jobId: job.jobId,
      scope: "recording",
      recordingId: job.recA.id,
      reportId: job.report.id,
      tokenHash: hashShareToken(generateShareToken()),
      label: "mode test",
      expiresAt: new Date(Date.now() + 3600_000),
    })
    .returning();
  linkId = link.id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("share-link media mode", () => {
  it("opens the file its grant names, inside the scope", async () => {
    const g = await authorize(playable(job.recA.id), grant("playable", job.recA.id));
    expect(g.principal).toMatchObject({ type: "share-link", shareLinkId: linkId, organisationId: orgId });
    expect(g.file.storageKey).toBe(job.recA.renditionKeys.playable);
    expect(await codeOf(authorize({ kind: "still", stillId: job.fA.stillId }, grant("still", job.fA.stillId)))).toBe("ok");
    expect(await codeOf(authorize({ kind: "report", reportId: job.report.id }, grant("report", job.report.id)))).toBe("ok");
  });

  it("refuses another file than the grant names, even inside the scope", async () => {
    // a poster grant does not open the playable file; a still grant does not open the report
    expect(await codeOf(authorize(playable(job.recA.id), grant("poster", job.recA.id)))).toBe("not_found");
    expect(await codeOf(authorize({ kind: "report", reportId: job.report.id }, grant("still", job.fA.stillId)))).toBe("not_found");
  });

  it("refuses another recording's files, even with a validly signed grant for them", async () => {
    expect(await codeOf(authorize(playable(job.recB.id), grant("playable", job.recB.id)))).toBe("not_found");
    expect(await codeOf(authorize({ kind: "still", stillId: job.fB.stillId }, grant("still", job.fB.stillId)))).toBe("not_found");
  });

  it("answers 401 for a bad or expired grant and 410 once the link is revoked", async () => {
    expect(await codeOf(authorize(playable(job.recA.id), "not-a-grant"))).toBe("unauthenticated");
    expect(await codeOf(authorize(playable(job.recA.id), grant("playable", job.recA.id, Math.floor(Date.now() / 1000) - 1)))).toBe("unauthenticated");
    const token = grant("playable", job.recA.id);
    expect(await codeOf(authorize(playable(job.recA.id), token, { range: "bytes=0-9" }))).toBe("ok");
    await db().update(s.shareLinks).set({ revokedAt: new Date() }).where(eq(s.shareLinks.id, linkId));
    expect(await codeOf(authorize(playable(job.recA.id), token, { range: "bytes=10-19" }))).toBe("gone");
  });
});
