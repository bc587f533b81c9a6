// The workspace pages the phone and accessibility browser tests walk, with real ids from the demo
// scenario (db/seed) plus a shared job made here, and a share link to it for the share pages.
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { demoOrganisationId } from "@/tests/support/session";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";

export type WalkedPage = { name: string; path: string };

export async function workspacePages(): Promise<{ pages: WalkedPage[]; sharePath: string; jobPath: string; recordingPath: string }> {
  const orgId = await demoOrganisationId();
  const job = await makeSharedJob(orgId);
  const [demoRec] = await db()
    .select({ id: s.recordings.id, jobId: s.recordings.jobId, flightId: s.recordings.flightId })
    .from(s.recordings)
    .where(and(eq(s.recordings.organisationId, orgId), isNull(s.recordings.deletedAt)))
    .orderBy(s.recordings.createdAt)
    .limit(1);
  const rec = demoRec ?? { id: job.recA.id, jobId: job.jobId, flightId: job.flightId };
  const token = generateShareToken();
  await db()
    .insert(s.shareLinks)
    .values({ organisationId: orgId, jobId: job.jobId, scope: "job", tokenHash: hashShareToken(token), label: "Axe and phone check", expiresAt: new Date(Date.now() + 86_400_000) });
  const pages: WalkedPage[] = [
    { name: "today", path: "/today" },
    { name: "jobs", path: "/jobs" },
    { name: "job", path: `/jobs/${rec.jobId}` },
    { name: "shared job", path: `/jobs/${job.jobId}` },
    { name: "flights", path: "/flights" },
    { name: "flight", path: `/flights/${rec.flightId}` },
    { name: "recording", path: `/recordings/${rec.id}` },
    { name: "upload", path: `/upload?jobId=${rec.jobId}&flightId=${rec.flightId}` },
    { name: "clients", path: "/clients" },
    { name: "sites", path: "/sites" },
    { name: "range calculator", path: "/range" },
    { name: "range checks", path: `/range/checks?flightId=${rec.flightId}` },
    { name: "custody log", path: "/custody" },
    { name: "members", path: "/members" },
  ];
  return { pages, sharePath: `/s/${token}`, jobPath: `/jobs/${rec.jobId}`, recordingPath: `/recordings/${rec.id}` };
}
