// Stores the alignment of a flight's track with its recordings: either the proposal from file times,
// accepted as it is, or the pilot's match of a frame to a track point. Each is a new row with who set it
// and when, and a custody event in the same transaction (lib/tracks/align-track.ts explains the sums).
import "server-only";
import { db } from "@/db/client";
import { trackAlignments } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";
import { getRangeCheckFlightOrThrow } from "@/lib/range-checks/flight-for-range-check";
import { clocksOf, loadRecordingClocks, loadTrackRow } from "./load-flight-track";
import { offsetFromFrameMatch, proposeOffset } from "./align-track";
import type { TrackAlignmentInput } from "./track-input";

const refuse = (field: string, message: string) => new ApiError("unprocessable", "Some fields are not valid", { [field]: [message] });

export async function setTrackAlignment(member: Pick<Member, "organisationId" | "userId" | "role">, flightId: string, input: TrackAlignmentInput, facts: RequestFacts = { clientAddress: null, userAgent: null }) {
  const orgId = member.organisationId;
  const flight = await getRangeCheckFlightOrThrow(orgId, flightId);
  const track = await loadTrackRow(orgId, flight.id);
  if (!track) throw notFound("This flight has no track yet; import one first");
  const recs = await loadRecordingClocks(orgId, flight.id);

  let values: { offsetMs: number; uncertaintyMs: number; method: string; recordingId: string | null; frame: number | null; pointIndex: number | null };
  if (input.method === "file_times") {
    const clocks = clocksOf(recs);
    if (!clocks.length) throw refuse("method", "No recording of this flight has a file time; match a frame to a track point instead");
    const p = proposeOffset(clocks, { startMs: track.startsAt.getTime(), endMs: track.endsAt.getTime() });
    values = { offsetMs: p.offsetMs, uncertaintyMs: p.uncertaintyMs, method: "file_times", recordingId: null, frame: null, pointIndex: null };
  } else {
    const rec = recs.find((r) => r.id === input.recordingId);
    if (!rec) throw refuse("recordingId", "Choose a recording of this flight");
    if (rec.startMs === null || rec.fps === null || rec.durationSec === null) throw refuse("recordingId", `${rec.name} is not processed yet or has no file time; choose another recording`);
    const frameCount = Math.round(rec.durationSec * rec.fps);
    if (input.frame >= frameCount) throw refuse("frame", `${rec.name} has frames 0 to ${frameCount - 1}`);
    const times = track.points;
    if (input.pointIndex >= times.length) throw refuse("pointIndex", `The track has points 1 to ${times.length}`);
    const m = offsetFromFrameMatch({
      recordingStartMs: rec.startMs,
      frame: input.frame,
      fps: rec.fps,
      pointTimeMs: times[input.pointIndex][0],
      prevPointMs: input.pointIndex > 0 ? times[input.pointIndex - 1][0] : null,
      nextPointMs: input.pointIndex < times.length - 1 ? times[input.pointIndex + 1][0] : null,
    });
    values = { ...m, method: "frame_match", recordingId: rec.id, frame: input.frame, pointIndex: input.pointIndex };
  }

  return db().transaction(async (tx) => {
    const [row] = await tx
      .insert(trackAlignments)
      .values({ organisationId: orgId, trackId: track.id, ...values, setBy: member.userId })
      .returning({ id: trackAlignments.id, createdAt: trackAlignments.createdAt });
    await recordCustodyEvent(
      {
        organisationId: orgId,
        eventType: "track_aligned",
        evidenceType: "track",
        evidenceId: track.id,
        jobId: track.jobId,
        originalSha256: track.sha256,
        originalSize: track.sizeBytes,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        purpose: values.method === "file_times" ? "alignment proposed from file times accepted" : "frame matched to a track point",
        details: { alignmentId: row.id, flightId: flight.id, ...values },
      },
      tx,
    );
    return { id: row.id, setAt: row.createdAt.toISOString(), ...values };
  });
}
