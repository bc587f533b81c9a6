// The state of a finding kept with each revision: every field an editor can change, plus the
// still it pointed at and the condition rating its severity maps to at that moment.
import type { Finding } from "@/db/schema/types";
import { SEVERITY_SCALE } from "./severity-scale";

export function findingSnapshot(f: Finding, stillId: string | null): Record<string, unknown> {
  return {
    recordingId: f.recordingId,
    startFrame: f.startFrame,
    endFrame: f.endFrame,
    startSec: f.startSec,
    endSec: f.endSec,
    severity: f.severity,
    nbiRating: SEVERITY_SCALE[f.severity].nbiRating,
    categoryId: f.categoryId,
    note: f.note,
    box: f.box,
    latitude: f.latitude,
    longitude: f.longitude,
    heightAglM: f.heightAglM,
    groundDistanceM: f.groundDistanceM,
    slantDistanceM: f.slantDistanceM,
    stillId,
    deletedAt: f.deletedAt ? f.deletedAt.toISOString() : null,
  };
}
