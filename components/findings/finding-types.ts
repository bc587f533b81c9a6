// Findings and categories as the JSON API sends them (dates as ISO strings).
import type { Severity } from "@/lib/findings/severity-scale";
import type { FrameBox } from "@/db/schema/review";

export type StillItem = { id: string; state: "pending" | "ready" | "failed"; frameNumber: number; width: number | null; height: number | null; sha256: string | null; failureReason: string | null };

export type FindingItem = {
  id: string;
  jobId: string;
  recordingId: string;
  recordingName: string;
  recordingSha256: string;
  startFrame: number;
  endFrame: number | null;
  startSec: number;
  endSec: number | null;
  severity: Severity;
  categoryId: string | null;
  categoryName: string | null;
  note: string;
  box: FrameBox | null;
  latitude: number | null;
  longitude: number | null;
  heightAglM: number | null;
  groundDistanceM: number | null;
  slantDistanceM: number | null;
  version: number;
  createdBy: { id: string; name: string } | null;
  createdAt: string;
  updatedAt: string;
  still: StillItem | null;
};

export type CategoryItem = { id: string; name: string; assetKind: string | null; archivedAt: string | null; findingCount: number };
