"use client";
// Submits a form to our API and maps the server's field errors back onto react-hook-form.
// T is the form's field values; B is what is sent (by default the same), for forms whose
// fields differ from the API's (e.g. an altitude typed in feet, sent in metres).
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { fetchJson, FetchError } from "@/components/fetch-json";

export function useSave<T extends FieldValues, R = unknown, B = T>(opts: {
  url: string | ((v: B) => string);
  method?: "POST" | "PATCH" | "DELETE";
  invalidate: string[];
  setError?: UseFormSetError<T>;
  /** server field name -> form field name, where they differ */
  fieldMap?: Record<string, Path<T>>;
  onDone?: (result: R) => void;
}) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (values: B) =>
      fetchJson<R>(typeof opts.url === "function" ? opts.url(values) : opts.url, { method: opts.method ?? "POST", json: values }),
    onSuccess: async (r) => {
      await Promise.all(opts.invalidate.map((k) => qc.invalidateQueries({ queryKey: [k] })));
      opts.onDone?.(r);
    },
    onError: (err) => {
      if (err instanceof FetchError && err.fields && opts.setError) {
        for (const [k, msgs] of Object.entries(err.fields)) opts.setError((opts.fieldMap?.[k] ?? k) as Path<T>, { message: msgs[0] });
      }
    },
  });
}
