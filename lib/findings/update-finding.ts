// Edits a finding. The previous state stays in finding_revisions; the new version, its revision and
// the custody event are written together. Moving a finding to another frame asks for a new still
// (the old one is kept: it shows what the earlier version pointed at).
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findingRevisions, findings } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import type { UpdateFindingInput } from "./finding-input";
import { loadReviewRecording, requireTiming } from "../recordings/load-review-recording";
import { resolveFindingSpan } from "./resolve-finding-span";
import { computeFindingPosition } from "./compute-finding-position";
import { checkCategory } from "./check-category";
import { findingSnapshot } from "./finding-snapshot";
import { insertPendingStill, enqueueStill } from "./request-still";
import { latestStills, loadFindingView, type FindingView } from "./finding-view";
import { asApiSpan, type FindingActor } from "./create-finding";

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

export async function updateFinding(organisationId: string, id: string, input: UpdateFindingInput, actor: FindingActor): Promise<FindingView> {
  const { newStillId } = await db().transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(findings)
      .where(and(eq(findings.id, id), eq(findings.organisationId, organisationId), isNull(findings.deletedAt)))
      .for("update");
    if (!current) throw notFound("Finding not found");
    if (input.version !== undefined && input.version !== current.version) {
      throw new ApiError("conflict", `This finding was changed meanwhile (now version ${current.version}); reload it and edit again`);
    }
    const rec = await loadReviewRecording(organisationId, current.recordingId, tx);

    const spanTouched = ["startFrame", "startSec", "endFrame", "endSec"].some((k) => has(input, k));
    const span = spanTouched
      ? asApiSpan(() =>
          resolveFindingSpan(
            {
              ...(input.startFrame !== undefined || input.startSec !== undefined
                ? { startFrame: input.startFrame, startSec: input.startSec }
                : { startFrame: current.startFrame }),
              ...(has(input, "endFrame") || has(input, "endSec") ? { endFrame: input.endFrame, endSec: input.endSec } : { endFrame: current.endFrame }),
            },
            requireTiming(rec),
          ),
        )
      : null;
    if (input.categoryId) await checkCategory(tx, organisationId, input.categoryId, input.categoryId === current.categoryId);

    const positionTouched = ["latitude", "longitude", "heightAglM"].some((k) => has(input, k));
    const position = positionTouched
      ? computeFindingPosition(rec.launch, {
          latitude: has(input, "latitude") ? (input.latitude ?? null) : current.latitude,
          longitude: has(input, "longitude") ? (input.longitude ?? null) : current.longitude,
          heightAglM: has(input, "heightAglM") ? (input.heightAglM ?? null) : current.heightAglM,
        })
      : {};

    const changes = {
      ...(span ?? {}),
      ...(input.severity !== undefined ? { severity: input.severity } : {}),
      ...(has(input, "categoryId") ? { categoryId: input.categoryId ?? null } : {}),
      ...(input.note !== undefined ? { note: input.note } : {}),
      ...(has(input, "box") ? { box: input.box ?? null } : {}),
      ...position,
    };
    const changed = Object.keys(changes).filter((k) => JSON.stringify((changes as Record<string, unknown>)[k]) !== JSON.stringify((current as Record<string, unknown>)[k]));
    if (!changed.length) return { newStillId: null };

    const version = current.version + 1;
    const [updated] = await tx
      .update(findings)
      .set({ ...changes, version, updatedAt: new Date() })
      .where(and(eq(findings.id, id), eq(findings.organisationId, organisationId)))
      .returning();
    const moved = span !== null && span.startFrame !== current.startFrame;
    const newStillId = moved
      ? await insertPendingStill(tx, { organisationId, recordingId: rec.id, findingId: id, frameNumber: span.startFrame, timeSec: span.startSec })
      : null;
    const stillId = newStillId ?? (await latestStills(organisationId, [id], tx)).get(id)?.id ?? null;
    await tx.insert(findingRevisions).values({
      organisationId,
      findingId: id,
      version,
      action: "updated",
      snapshot: findingSnapshot(updated, stillId),
      editedBy: actor.userId,
    });
    await recordCustodyEvent(
      {
        organisationId,
        eventType: "finding_updated",
        evidenceType: "finding",
        evidenceId: id,
        jobId: current.jobId,
        originalSha256: rec.sha256,
        originalSize: rec.sizeBytes,
        actor: { userId: actor.userId, role: actor.role },
        clientAddress: actor.clientAddress,
        userAgent: actor.userAgent,
        details: { recordingId: rec.id, version, changed },
      },
      tx,
    );
    return { newStillId };
  });
  if (newStillId) await enqueueStill(newStillId);
  const view = await loadFindingView(organisationId, id);
  if (!view) throw notFound("Finding not found");
  return view;
}
