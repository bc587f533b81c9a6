// Where a recording's processing stands, as the pages show it ("Processing 42 %", "Failed: ...").
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { RECORDING_NOT_FOUND } from "./request-reprocess";

export type ProcessingProgress = {
  id: string;
  state: "waiting" | "processing" | "ready" | "failed";
  progress: number;
  failureReason: string | null;
  processedAt: string | null;
};

export async function readProcessingProgress(organisationId: string, recordingId: string): Promise<ProcessingProgress> {
  const [row] = await db()
    .select({
      id: recordings.id,
      state: recordings.state,
      progress: recordings.progress,
      failureReason: recordings.failureReason,
      processedAt: recordings.processedAt,
    })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)));
  if (!row) throw new ApiError("not_found", RECORDING_NOT_FOUND);
  return { ...row, processedAt: row.processedAt?.toISOString() ?? null };
}
