// Asks for a finding's still once more, as a new still row: the earlier attempt stays on record.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findings } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { insertPendingStill, enqueueStill } from "./request-still";

export async function requestStillAgain(organisationId: string, findingId: string): Promise<{ stillId: string; queued: boolean }> {
  const stillId = await db().transaction(async (tx) => {
    const [f] = await tx
      .select({ recordingId: findings.recordingId, startFrame: findings.startFrame, startSec: findings.startSec })
      .from(findings)
      .where(and(eq(findings.id, findingId), eq(findings.organisationId, organisationId), isNull(findings.deletedAt)));
    if (!f) throw notFound("Finding not found");
    return insertPendingStill(tx, { organisationId, recordingId: f.recordingId, findingId, frameNumber: f.startFrame, timeSec: f.startSec });
  });
  return { stillId, queued: await enqueueStill(stillId) };
}
