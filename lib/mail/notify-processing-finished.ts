// Tells the job's crew that a recording finished processing (ready to review) or failed, with a
// link to it. Safe to call twice for the same outcome (the worker may retry): one mail per outcome.
// Never throws: a mail problem must not fail or retry the processing job that calls this.
import "server-only";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, organisations, recordings } from "@/db/schema";
import { env } from "@/lib/config/env";
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import { jobCrew } from "./job-crew";
import { sendOnce } from "./send-once";
import { describeLostFrames, readRecordingFigures, type RecordingFigures } from "@/lib/recordings/recording-figures";

export type NotifyResult = { sent: string[]; skipped?: string; error?: string };

export const recordingPageUrl = (recordingId: string) => `${env().APP_URL.replace(/\/+$/, "")}/recordings/${recordingId}`;

/** " (360 frames, 45 lost)" from the stored figures; frames count recorder frame slots, lost ones included. */
function describeFrames(f: RecordingFigures | null): string {
  if (!f) return "";
  return f.signalKnown && f.framesLost > 0 ? ` (${f.frameSlots} frames, ${describeLostFrames(f)} lost)` : ` (${f.frameSlots} frames)`;
}

export async function notifyProcessingFinished(recordingId: string): Promise<NotifyResult> {
  try {
    const [rec] = await db()
      .select({
        id: recordings.id,
        organisationId: recordings.organisationId,
        jobId: recordings.jobId,
        originalName: recordings.originalName,
        state: recordings.state,
        failureReason: recordings.failureReason,
        durationSec: recordings.durationSec,
        figures: recordings.figures,
        processedAt: recordings.processedAt,
        uploadedBy: recordings.uploadedBy,
        deletedAt: recordings.deletedAt,
        jobTitle: jobs.title,
        organisationName: organisations.name,
      })
      .from(recordings)
      .innerJoin(jobs, and(eq(jobs.id, recordings.jobId), eq(jobs.organisationId, recordings.organisationId)))
      .innerJoin(organisations, eq(organisations.id, recordings.organisationId))
      .where(eq(recordings.id, recordingId));
    if (!rec || rec.deletedAt) return { sent: [], skipped: "no such recording" };
    if (rec.state !== "ready" && rec.state !== "failed") return { sent: [], skipped: `still ${rec.state}` };
    const crew = await jobCrew(rec.organisationId, rec.jobId, [rec.uploadedBy]);
    if (crew.length === 0) return { sent: [], skipped: "no crew to tell" };
    const ready = rec.state === "ready";
    const subject = ready ? `Ready to review: ${rec.originalName} (${rec.jobTitle})` : `Processing failed: ${rec.originalName} (${rec.jobTitle})`;
    const paragraphs = ready
      ? [
          `${rec.originalName} in "${rec.jobTitle}" has been processed and is ready to review.`,
          ...(rec.durationSec ? [`Duration ${formatClockTime(rec.durationSec)}${describeFrames(readRecordingFigures(rec))}. The original is kept byte for byte with its SHA-256.`] : []),
        ]
      : [`Processing ${rec.originalName} in "${rec.jobTitle}" failed: ${rec.failureReason ?? "no reason given"}.`, "The original is kept unchanged; you can ask for it to be processed again."];
    const fact = `processing:${rec.id}:${rec.state}:${rec.processedAt?.getTime() ?? "none"}`;
    const outcome = await sendOnce(fact, () =>
      sendMail({ to: crew.map((c) => c.email), subject, ...composeMail([...paragraphs, `${rec.organisationName}`], { label: ready ? "Open the recording" : "See what failed", url: recordingPageUrl(rec.id) }) }),
    );
    return outcome === "sent" ? { sent: crew.map((c) => c.email) } : { sent: [], skipped: "already sent" };
  } catch (err) {
    console.error("[cairn] processing notification failed:", (err as Error).message);
    return { sent: [], error: (err as Error).message };
  }
}
