"use client";
// Marks a finding at the current frame or over a range, or edits one: severity (with meanings),
// category, note, an optional box drawn on the picture, an optional position. The moment comes from
// the player (buttons and the i / o shortcuts); the server checks it against the recording again.
// The draft is state of the review room (the player's shortcuts and the box drawn on the picture
// change it), so this form edits that draft rather than holding its own react-hook-form state; it
// validates with the API's zod schema (lib/findings/finding-input.ts) before sending.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import type { FrameBox } from "@/db/schema/review";
import { fetchJson, FetchError } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { FormError } from "@/components/ui/panel";
import { describeMoment, formatMoment } from "@/lib/findings/describe-moment";
import { NOTE_MAX, createFindingInput, updateFindingInput } from "@/lib/findings/finding-input";
import { fieldErrors } from "@/lib/validation/field-errors";
import type { Severity } from "@/lib/findings/severity-scale";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { SeverityField } from "./severity-field";
import type { CategoryItem, FindingItem } from "./finding-types";
import { AltitudeCautions } from "@/components/work/altitude-cautions";

export type FindingDraft = {
  id?: string;
  version?: number;
  startFrame: number;
  endFrame: number | null;
  severity: Severity | null;
  categoryId: string;
  note: string;
  box: FrameBox | null;
  latitude: string;
  longitude: string;
  heightAglM: string;
};

export function draftFrom(f: FindingItem): FindingDraft {
  return {
    id: f.id,
    version: f.version,
    startFrame: f.startFrame,
    endFrame: f.endFrame,
    severity: f.severity,
    categoryId: f.categoryId ?? "",
    note: f.note,
    box: f.box,
    latitude: f.latitude?.toString() ?? "",
    longitude: f.longitude?.toString() ?? "",
    heightAglM: f.heightAglM?.toString() ?? "",
  };
}

export const emptyDraft = (frame: number): FindingDraft => ({ startFrame: frame, endFrame: null, severity: null, categoryId: "", note: "", box: null, latitude: "", longitude: "", heightAglM: "" });

const num = (s: string) => (s.trim() === "" ? null : Number(s));

export function FindingForm({
  recordingId,
  draft,
  onChange,
  currentFrame,
  rate,
  frameCount,
  categories,
  drawing,
  onToggleDrawing,
  onSaved,
  onCancel,
  onEditCategories,
}: {
  recordingId: string;
  draft: FindingDraft;
  onChange(patch: Partial<FindingDraft>): void;
  currentFrame: number;
  rate: FrameRate;
  frameCount: number;
  categories: CategoryItem[];
  drawing: boolean;
  onToggleDrawing(): void;
  onSaved(f: FindingItem): void;
  onCancel(): void;
  onEditCategories(): void;
}) {
  const qc = useQueryClient();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const editing = !!draft.id;
  const save = useMutation({
    mutationFn: () => {
      const body = {
        startFrame: draft.startFrame,
        endFrame: draft.endFrame,
        severity: draft.severity ?? undefined,
        categoryId: draft.categoryId || null,
        note: draft.note,
        box: draft.box,
        latitude: num(draft.latitude),
        longitude: num(draft.longitude),
        heightAglM: num(draft.heightAglM),
      };
      // checked in the browser with the route's own schema first: the same messages, no round trip
      const checked = editing ? updateFindingInput.safeParse({ ...body, version: draft.version }) : createFindingInput.safeParse({ ...body, recordingId });
      if (!checked.success) throw new FetchError("Some fields are not valid", 422, fieldErrors(checked.error));
      return editing
        ? fetchJson<FindingItem>(`/api/findings/${draft.id}`, { method: "PATCH", json: { ...body, version: draft.version } })
        : fetchJson<FindingItem>("/api/findings", { method: "POST", json: { ...body, recordingId } });
    },
    onMutate: () => setFields({}),
    onSuccess: async (f) => {
      await qc.invalidateQueries({ queryKey: ["findings"] });
      onSaved(f);
    },
    onError: (err) => setFields(err instanceof FetchError && err.fields ? err.fields : {}),
  });
  const fe = (k: string) => fields[k]?.[0];
  const start = describeMoment(draft.startFrame, rate);
  const end = draft.endFrame === null ? null : describeMoment(draft.endFrame, rate);

  return (
    <form
      aria-label={editing ? "Edit finding" : "Mark a finding"}
      className="flex flex-col gap-3 rounded-md border border-lake bg-paper p-3"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <h2 className="text-base font-semibold">{editing ? `Edit finding (version ${draft.version})` : "Mark a finding"}</h2>

      <div className="flex flex-col gap-1 text-sm">
        <span className="font-medium">{end ? "From" : "At"}</span>
        <span className="font-mono text-xs" data-testid="draft-start">
          {formatMoment(start)}
        </span>
        {fe("startFrame") && <span role="alert" className="text-xs font-medium text-bad">{fe("startFrame")}</span>}
        <div className="flex flex-wrap gap-2">
          <Button type="button" variant="secondary" className="min-h-8 px-2 py-1 text-xs" onClick={() => onChange({ startFrame: currentFrame, ...(draft.endFrame !== null && draft.endFrame <= currentFrame ? { endFrame: null } : {}) })}>
            Start at this frame (i)
          </Button>
          {end ? (
            <Button type="button" variant="secondary" className="min-h-8 px-2 py-1 text-xs" onClick={() => onChange({ endFrame: null })}>
              One frame only
            </Button>
          ) : null}
          <Button type="button" variant="secondary" className="min-h-8 px-2 py-1 text-xs" disabled={currentFrame <= draft.startFrame} onClick={() => onChange({ endFrame: currentFrame })}>
            End range at this frame (o)
          </Button>
        </div>
        {end && (
          <>
            <span className="font-medium">To</span>
            <span className="font-mono text-xs" data-testid="draft-end">
              {formatMoment(end)}
            </span>
          </>
        )}
        {fe("endFrame") && <span role="alert" className="text-xs font-medium text-bad">{fe("endFrame")}</span>}
        <span className="text-xs text-ink-2">Frames 0 to {frameCount - 1}. Step with , and . to choose the exact frame.</span>
      </div>

      <SeverityField value={draft.severity} onChange={(severity) => onChange({ severity })} error={fe("severity")} />

      <div className="flex items-end gap-2">
        <SelectField label="Category" className="flex-1" value={draft.categoryId} onChange={(e) => onChange({ categoryId: e.target.value })} error={fe("categoryId")}>
          <option value="">No category</option>
          {categories.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <Button type="button" variant="quiet" className="text-xs" onClick={onEditCategories}>
          Edit categories
        </Button>
      </div>

      <TextAreaField label="Note" value={draft.note} maxLength={NOTE_MAX} onChange={(e) => onChange({ note: e.target.value })} error={fe("note")} placeholder="What is visible, where, how large" />

      <div className="flex flex-col gap-1 text-sm">
        <span className="font-medium">Box on the frame</span>
        <div className="flex flex-wrap items-center gap-2">
          <Button type="button" variant={drawing ? "primary" : "secondary"} className="min-h-8 px-2 py-1 text-xs" aria-pressed={drawing} onClick={onToggleDrawing}>
            {drawing ? "Drawing: drag on the picture" : draft.box ? "Redraw box (b)" : "Draw a box (b)"}
          </Button>
          {draft.box && (
            <>
              <span className="font-mono text-xs" data-testid="draft-box">
                x {draft.box.x.toFixed(3)} y {draft.box.y.toFixed(3)} w {draft.box.w.toFixed(3)} h {draft.box.h.toFixed(3)}
              </span>
              <Button type="button" variant="quiet" className="min-h-8 px-2 py-1 text-xs" onClick={() => onChange({ box: null })}>
                Remove box
              </Button>
            </>
          )}
        </div>
        {fe("box") && <span role="alert" className="text-xs font-medium text-bad">{fe("box")}</span>}
      </div>

      <details className="text-sm" open={!!(draft.latitude || draft.longitude)}>
        <summary className="cursor-pointer font-medium">Position (optional)</summary>
        <div className="mt-2 grid grid-cols-2 gap-2">
          <Field label="Latitude" inputMode="decimal" value={draft.latitude} onChange={(e) => onChange({ latitude: e.target.value })} error={fe("latitude")} placeholder="54.41237" />
          <Field label="Longitude" inputMode="decimal" value={draft.longitude} onChange={(e) => onChange({ longitude: e.target.value })} error={fe("longitude")} placeholder="-2.61942" />
          {/* one wording for this height across Cairn (the range-check form says the same): AGL, measured at the launch point */}
          <Field
            label="Height above ground level (AGL)"
            unit="m"
            inputMode="decimal"
            className="col-span-2"
            value={draft.heightAglM}
            onChange={(e) => onChange({ heightAglM: e.target.value })}
            error={fe("heightAglM")}
            hint="Measured from the ground at the launch point; gives the slant distance from there"
          />
          <div className="col-span-2">
            <AltitudeCautions metres={Number.isFinite(Number.parseFloat(draft.heightAglM)) ? Number.parseFloat(draft.heightAglM) : null} />
          </div>
        </div>
      </details>

      <FormError error={save.error && !Object.keys(fields).length ? save.error : null} />
      {Object.keys(fields).length > 0 && (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          {save.error?.message}: {Object.entries(fields).map(([k, v]) => `${k === "_" ? "" : `${k}: `}${v.join(" ")}`).join("; ")}
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit" busy={save.isPending} disabled={!draft.severity}>
          {editing ? "Save finding" : "Save finding"}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
