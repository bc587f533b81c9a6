"use client";
// Data hooks for findings and categories. While a still is being extracted the list polls, so the
// still appears without a reload.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { fetchAllPages } from "@/components/fetch-all-pages";
import type { CategoryItem, FindingItem } from "./finding-types";

export function useFindings(filter: { recordingId: string } | { jobId: string }) {
  const qs = "recordingId" in filter ? `recordingId=${filter.recordingId}` : `jobId=${filter.jobId}`;
  return useQuery({
    queryKey: ["findings", qs],
    // the review room draws every finding of the recording: read all pages
    queryFn: () => fetchAllPages<FindingItem>(`/api/findings?${qs}`),
    refetchInterval: (q) => (q.state.data?.items.some((f) => f.still?.state === "pending") ? 1500 : false),
  });
}

export function useCategories(assetKind?: string | null) {
  const qs = assetKind ? `?assetKind=${assetKind}` : "";
  return useQuery({
    queryKey: ["finding-categories", qs],
    queryFn: () => fetchJson<{ items: CategoryItem[]; total: number }>(`/api/finding-categories${qs}`),
  });
}
