// Findings and categories as the JSON API sends them: the server's view types, with dates as ISO strings.
import type { FindingView, StillView } from "@/lib/findings/finding-view";

export type StillItem = StillView;

export type FindingItem = Omit<FindingView, "createdAt" | "updatedAt"> & { createdAt: string; updatedAt: string };

export type CategoryItem = { id: string; name: string; assetKind: string | null; archivedAt: string | null; findingCount: number };
