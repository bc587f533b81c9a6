// Marks a finding: the finding, its first revision, a pending still and the custody event are written
// in one transaction, so a refused or failed request leaves nothing behind.
import "server-only";
import { db } from "@/db/client";
import { findingRevisions, findings } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import type { Role } from "@/db/schema/types";
import type { CreateFindingInput } from "./finding-input";
import { loadReviewRecording, requireTiming } from "../recordings/load-review-recording";
import { resolveFindingSpan, FindingSpanError } from "./resolve-finding-span";
import { computeFindingPosition } from "./compute-finding-position";
import { checkCategory } from "./check-category";
import { findingSnapshot } from "./finding-snapshot";
import { insertPendingStill, enqueueStill } from "./request-still";
import { loadFindingView, type FindingView } from "./finding-view";

export type FindingActor = { userId: string; role: Role; clientAddress: string | null; userAgent: string | null };

/** Runs a span computation, turning its refusal into the API's 422 with field messages. */
export function asApiSpan<T>(compute: () => T): T {
  try {
    return compute();
  } catch (err) {
    if (err instanceof FindingSpanError) throw new ApiError("unprocessable", "The finding does not fit the recording", err.fields);
    throw err;
  }
}

export async function createFinding(organisationId: string, input: CreateFindingInput, actor: FindingActor): Promise<FindingView> {
  const { stillId, findingId } = await db().transaction(async (tx) => {
    const rec = await loadReviewRecording(organisationId, input.recordingId, tx);
    const timing = requireTiming(rec);
    const span = asApiSpan(() => resolveFindingSpan(input, timing));
    if (input.categoryId) await checkCategory(tx, organisationId, input.categoryId, false);
    const position = computeFindingPosition(rec.launch, {
      latitude: input.latitude ?? null,
      longitude: input.longitude ?? null,
      heightAglM: input.heightAglM ?? null,
    });

    const [finding] = await tx
      .insert(findings)
      .values({
        organisationId,
        jobId: rec.jobId,
        recordingId: rec.id,
        ...span,
        severity: input.severity,
        categoryId: input.categoryId ?? null,
        note: input.note ?? "",
        box: input.box ?? null,
        ...position,
        version: 1,
        createdBy: actor.userId,
      })
      .returning();
    const stillId = await insertPendingStill(tx, {
      organisationId,
      recordingId: rec.id,
      findingId: finding.id,
      frameNumber: span.startFrame,
      timeSec: span.startSec,
    });
    await tx.insert(findingRevisions).values({
      organisationId,
      findingId: finding.id,
      version: 1,
      action: "created",
      snapshot: findingSnapshot(finding, stillId),
      editedBy: actor.userId,
    });
    await recordCustodyEvent(
      {
        organisationId,
        eventType: "finding_created",
        evidenceType: "finding",
        evidenceId: finding.id,
        jobId: rec.jobId,
        originalSha256: rec.sha256,
        originalSize: rec.sizeBytes,
        actor: { userId: actor.userId, role: actor.role },
        clientAddress: actor.clientAddress,
        userAgent: actor.userAgent,
        details: { recordingId: rec.id, startFrame: span.startFrame, endFrame: span.endFrame, severity: finding.severity, version: 1 },
      },
      tx,
    );
    return { stillId, findingId: finding.id };
  });
  await enqueueStill(stillId);
  return (await loadFindingView(organisationId, findingId))!;
}
