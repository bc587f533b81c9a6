"use client";
// Choices for the pickers in forms (clients, sites, jobs, crew), read from the list endpoints.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import type { ListResult } from "@/components/ui/resource-table";

// A select fed by one of these lists is keyed on whether the list has loaded: a select mounted before
// its options exist cannot show the form's value, and remounting lets react-hook-form set it again.
// crews are small (2 to 30 people, a few hundred open jobs): one page of 200 covers a picker
const PICKER_PAGE = "200";

export function useOptions<T>(endpoint: string, key: string, params: Record<string, string> = {}, enabled = true) {
  const qs = new URLSearchParams({ pageSize: PICKER_PAGE, ...params });
  return useQuery({
    queryKey: [key, "options", qs.toString()],
    queryFn: () => fetchJson<ListResult<T>>(`${endpoint}?${qs}`),
    enabled,
    staleTime: 30_000,
  });
}

export type ClientOption = { id: string; name: string };
export type SiteOption = { id: string; name: string; clientName: string; timeZone: string; latitude: number | null; longitude: number | null };
export type JobOption = { id: string; title: string; siteName: string; status: string };
export type MemberOption = { userId: string; name: string; role: string };
