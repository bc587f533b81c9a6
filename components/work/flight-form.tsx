"use client";
// Log or edit a flight. The altitude is typed in the member's own unit and sent in metres; above the
// common limit the caution appears beside the field as it is typed.
import { useMemo } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { Role } from "@/db/schema/types";
import { toMetres } from "@/lib/geo/units";
import { altitudeForForm, flightForm, flightFormToInput, type AltitudeUnit, type FlightFormValues } from "@/lib/validation/flight-form";
import { isoDayFromNow, type FlightInput } from "@/lib/validation/work";
import { useSave } from "./use-save";
import { FormFooter } from "./form-footer";
import { useOptions, type JobOption, type MemberOption } from "./use-options";
import { AltitudeCautions } from "./altitude-cautions";

export type FlightFormRow = {
  id: string;
  jobId: string;
  flownOn: string;
  pilotId: string | null;
  aircraft: string | null;
  launchLatitude: number | null;
  launchLongitude: number | null;
  launchNotes: string | null;
  maxAltitudeAglM: number | null;
  notes: string | null;
  archivedAt: string | null;
};

export function FlightForm({
  row,
  jobId,
  units,
  me,
  onClose,
  onSaved,
}: {
  row: FlightFormRow | null;
  jobId?: string;
  units: AltitudeUnit;
  me: { userId: string; role: Role };
  onClose: () => void;
  onSaved?: (id: string) => void;
}) {
  const schema = useMemo(() => flightForm(units), [units]);
  type Input = z.input<typeof schema>;
  const jobs = useOptions<JobOption>("/api/jobs", "jobs", { status: "planned,fieldwork,review" }, !jobId);
  const pilots = useOptions<MemberOption>("/api/members", "members", { role: "pilot,owner" });
  const initialAltitude = altitudeForForm(row?.maxAltitudeAglM, units);
  const form = useForm<Input, unknown, FlightFormValues>({
    resolver: zodResolver(schema),
    defaultValues: {
      jobId: row?.jobId ?? jobId ?? "",
      flownOn: row?.flownOn ?? isoDayFromNow(0),
      pilotId: row?.pilotId ?? (row ? "" : me.role === "pilot" ? me.userId : ""),
      aircraft: row?.aircraft ?? "",
      launchLatitude: row?.launchLatitude ?? "",
      launchLongitude: row?.launchLongitude ?? "",
      launchNotes: row?.launchNotes ?? "",
      maxAltitude: initialAltitude,
      notes: row?.notes ?? "",
    },
  });
  const done = (r: { id: string }) => {
    onSaved?.(r.id);
    onClose();
  };
  const save = useSave<Input, { id: string }, FlightInput>({
    url: row ? `/api/flights/${row.id}` : "/api/flights",
    method: row ? "PATCH" : "POST",
    invalidate: ["flights", "jobs"],
    setError: form.setError,
    fieldMap: { maxAltitudeAglM: "maxAltitude" },
    onDone: done,
  });
  const archive = useSave<{ archived: boolean }, { id: string }>({ url: `/api/flights/${row?.id}`, method: "PATCH", invalidate: ["flights", "jobs"], onDone: done });
  const e = form.formState.errors;

  const typed = useWatch({ control: form.control, name: "maxAltitude" });
  const typedNumber = typeof typed === "number" ? typed : typeof typed === "string" && typed.trim() !== "" ? Number(typed) : null;
  const typedMetres = typedNumber != null && Number.isFinite(typedNumber) ? toMetres(typedNumber, units) : null;

  return (
    <Panel open title={row ? "Edit flight" : "Log a flight"} onClose={onClose}>
      <form
        className="flex flex-col gap-4"
        noValidate
        onSubmit={form.handleSubmit((v) => {
          // an untouched altitude goes back exactly as stored, not as the rounded figure shown
          const untouched = row && String(form.getValues("maxAltitude") ?? "") === initialAltitude ? row.maxAltitudeAglM : undefined;
          save.mutate(flightFormToInput(v, units, untouched));
        })}
      >
        {!jobId && (
          <SelectField key={jobs.data ? "jobs-ready" : "jobs-loading"} label="Job" {...form.register("jobId")} error={e.jobId?.message} disabled={jobs.isLoading}>
            <option value="">{jobs.isLoading ? "Loading jobs…" : "Choose an open job"}</option>
            {jobs.data?.items.map((j) => (
              <option key={j.id} value={j.id}>
                {j.title} · {j.siteName}
              </option>
            ))}
          </SelectField>
        )}
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <Field label="Flown on" placeholder="YYYY-MM-DD" autoComplete="off" style={{ fontFamily: "var(--font-mono)" }} hint="ISO 8601, the site's local date." {...form.register("flownOn")} error={e.flownOn?.message} />
          <SelectField key={pilots.data ? "pilots-ready" : "pilots-loading"} label="Pilot in command" {...form.register("pilotId")} error={e.pilotId?.message}>
            <option value="">Not recorded</option>
            {pilots.data?.items.map((m) => (
              <option key={m.userId} value={m.userId}>
                {m.name} ({ROLE_LABELS[m.role as Role]?.label ?? m.role})
              </option>
            ))}
          </SelectField>
        </div>
        <Field label="Aircraft" placeholder="Airframe, props, camera" {...form.register("aircraft")} error={e.aircraft?.message} />
        <div className="grid grid-cols-1 items-start gap-3 sm:grid-cols-[12rem_1fr]">
          <Field
            label="Max altitude AGL"
            inputMode="decimal"
            unit={units}
            hint={`Above ground level, in ${units === "ft" ? "feet" : "metres"}; stored in metres.`}
            style={{ fontFamily: "var(--font-mono)" }}
            {...form.register("maxAltitude")}
            error={e.maxAltitude?.message}
          />
          <div className="sm:pt-6">
            <AltitudeCautions metres={typedMetres} />
          </div>
        </div>
        <fieldset className="grid grid-cols-2 gap-3">
          <legend className="mb-1 text-sm font-medium">Launch point (decimal degrees, WGS 84)</legend>
          <Field label="Latitude" inputMode="decimal" style={{ fontFamily: "var(--font-mono)" }} unit="°" {...form.register("launchLatitude")} error={e.launchLatitude?.message} />
          <Field label="Longitude" inputMode="decimal" style={{ fontFamily: "var(--font-mono)" }} unit="°" {...form.register("launchLongitude")} error={e.launchLongitude?.message} />
        </fieldset>
        <TextAreaField label="Launch notes" {...form.register("launchNotes")} error={e.launchNotes?.message} />
        <TextAreaField label="Notes" placeholder="Wind, light, link behaviour, anything the reviewer should know" {...form.register("notes")} error={e.notes?.message} />
        <FormFooter submitLabel={row ? "Save flight" : "Log flight"} save={save} archive={archive} record={row} />
      </form>
    </Panel>
  );
}
