"use client";
// The organisation's finding categories: add, rename, file under an asset kind, archive or restore,
// and bring back the defaults. Archiving keeps existing findings' categories intact.
import { useQuery, useQueryClient, useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { Panel, FormError } from "@/components/ui/panel";
import { ASSET_KINDS, ASSET_KIND_LABELS } from "@/lib/validation/work";
import { categoryInput, type CategoryInput } from "@/lib/findings/category-input";
import { useSave } from "@/components/work/use-save";
import type { CategoryItem } from "./finding-types";

export function CategoriesEditor({ onClose, canWrite }: { onClose(): void; canWrite: boolean }) {
  const qc = useQueryClient();
  const [showArchived, setShowArchived] = useState(false);
  const list = useQuery({
    queryKey: ["finding-categories", `all-${showArchived ? 1 : 0}`],
    queryFn: () => fetchJson<{ items: CategoryItem[] }>(`/api/finding-categories?archived=${showArchived ? 1 : 0}`),
  });
  const refresh = () => qc.invalidateQueries({ queryKey: ["finding-categories"] });
  type NewCategory = { name: string; assetKind: string };
  const form = useForm<NewCategory, unknown, CategoryInput>({
    resolver: zodResolver(categoryInput) as unknown as Resolver<NewCategory, unknown, CategoryInput>,
    defaultValues: { name: "", assetKind: "" },
  });
  const add = useSave<NewCategory, unknown, CategoryInput>({ url: "/api/finding-categories", invalidate: ["finding-categories"], setError: form.setError, onDone: () => form.reset({ name: "", assetKind: form.getValues("assetKind") }) });
  const nameError = form.formState.errors.name?.message;
  const defaults = useMutation({ mutationFn: () => fetchJson<{ added: number }>("/api/finding-categories/defaults", { method: "POST" }), onSuccess: refresh });

  return (
    <Panel open title="Finding categories" onClose={onClose}>
      <p className="mb-3 text-sm text-ink-2">Categories filed under an asset kind are offered first on that kind of site; general ones everywhere.</p>
      {canWrite && (
        <form className="mb-4 flex flex-wrap items-end gap-2" noValidate onSubmit={form.handleSubmit((v) => add.mutate(v))}>
          <label className="flex flex-1 flex-col gap-1 text-sm">
            <span className="font-medium">New category</span>
            <input className="min-h-10 rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2" maxLength={80} aria-invalid={nameError ? true : undefined} {...form.register("name")} />
          </label>
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-medium">For</span>
            <select className="min-h-10 rounded-md border border-line bg-white px-2 text-sm dark:bg-paper-2" {...form.register("assetKind")}>
              <option value="">Any asset</option>
              {ASSET_KINDS.map((k) => (
                <option key={k} value={k}>
                  {ASSET_KIND_LABELS[k]}
                </option>
              ))}
            </select>
          </label>
          <Button type="submit" busy={add.isPending}>
            Add category
          </Button>
          {nameError && (
            <p role="alert" className="w-full text-xs font-medium text-bad">
              {nameError}
            </p>
          )}
          <div className="w-full">
            <FormError error={Object.keys(form.formState.errors).length ? null : add.error} />
          </div>
        </form>
      )}
      <label className="mb-2 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} /> Show archived
      </label>
      <ul className="flex flex-col divide-y divide-line/60 rounded-md border border-line">
        {list.data?.items.map((c) => (
          <CategoryRow key={c.id} c={c} canWrite={canWrite} onChanged={refresh} />
        ))}
        {list.data?.items.length === 0 && <li className="px-3 py-4 text-sm text-ink-2">{showArchived ? "No archived categories." : "No categories yet: add one, or restore the defaults."}</li>}
      </ul>
      {canWrite && (
        <div className="mt-4 flex items-center gap-2">
          <Button type="button" variant="secondary" busy={defaults.isPending} onClick={() => defaults.mutate()}>
            Restore default categories
          </Button>
          {defaults.data && <span className="text-sm">{defaults.data.added} added</span>}
        </div>
      )}
    </Panel>
  );
}

function CategoryRow({ c, canWrite, onChanged }: { c: CategoryItem; canWrite: boolean; onChanged(): void }) {
  const [name, setName] = useState(c.name);
  const save = useMutation({ mutationFn: (body: Record<string, unknown>) => fetchJson(`/api/finding-categories/${c.id}`, { method: "PATCH", json: body }), onSuccess: onChanged });
  return (
    <li className="flex flex-wrap items-center gap-2 px-3 py-2 text-sm">
      {canWrite ? (
        <input
          aria-label={`Name of ${c.name}`}
          className="min-h-8 flex-1 rounded border border-line bg-white px-2 dark:bg-paper-2"
          value={name}
          maxLength={80}
          onChange={(e) => setName(e.target.value)}
          onBlur={() => name.trim() && name !== c.name && save.mutate({ name })}
        />
      ) : (
        <span className="flex-1">{c.name}</span>
      )}
      <span className="text-xs text-ink-2">{c.assetKind ? ASSET_KIND_LABELS[c.assetKind as keyof typeof ASSET_KIND_LABELS] : "Any asset"}</span>
      <span className="text-xs text-ink-2">{c.findingCount} findings</span>
      {canWrite && (
        <button type="button" className="text-xs underline" onClick={() => save.mutate({ archived: !c.archivedAt })}>
          {c.archivedAt ? "Restore" : "Archive"}
        </button>
      )}
      {save.error && <span role="alert" className="w-full text-xs text-bad">{save.error.message}</span>}
    </li>
  );
}
