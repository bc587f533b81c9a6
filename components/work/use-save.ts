"use client";
// Submits a form to our API and maps the server's field errors back onto react-hook-form.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { fetchJson, FetchError } from "@/components/fetch-json";

export function useSave<T extends FieldValues, R = unknown>(opts: {
  url: string | ((v: T) => string);
  method?: "POST" | "PATCH" | "DELETE";
  invalidate: string[];
  setError?: UseFormSetError<T>;
  onDone?: (result: R) => void;
}) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (values: T) =>
      fetchJson<R>(typeof opts.url === "function" ? opts.url(values) : opts.url, { method: opts.method ?? "POST", json: values }),
    onSuccess: async (r) => {
      await Promise.all(opts.invalidate.map((k) => qc.invalidateQueries({ queryKey: [k] })));
      opts.onDone?.(r);
    },
    onError: (err) => {
      if (err instanceof FetchError && err.fields && opts.setError) {
        for (const [k, msgs] of Object.entries(err.fields)) opts.setError(k as Path<T>, { message: msgs[0] });
      }
    },
  });
}
