"use client";
// Create or edit a site: client, name, address, position in decimal degrees, time zone, kind, launch notes.
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { ASSET_KINDS, ASSET_KIND_LABELS, siteInput } from "@/lib/validation/work";
import { useSave } from "./use-save";
import { FormFooter } from "./form-footer";
import { useOptions, type ClientOption } from "./use-options";
import { TIME_ZONES } from "./time-zones";

export type SiteRow = {
  id: string;
  clientId: string;
  clientName: string;
  name: string;
  address: string | null;
  latitude: number | null;
  longitude: number | null;
  timeZone: string;
  assetKind: (typeof ASSET_KINDS)[number];
  launchNotes: string | null;
  archivedAt: string | null;
};
type Input = z.input<typeof siteInput>;
type Output = z.output<typeof siteInput>;

export function SiteForm({ row, defaultClientId, onClose }: { row: SiteRow | null; defaultClientId?: string; onClose: () => void }) {
  const clients = useOptions<ClientOption>("/api/clients", "clients", { sort: "name" });
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(siteInput),
    defaultValues: {
      clientId: row?.clientId ?? defaultClientId ?? "",
      name: row?.name ?? "",
      address: row?.address ?? "",
      latitude: row?.latitude ?? "",
      longitude: row?.longitude ?? "",
      timeZone: row?.timeZone ?? browserTimeZone(),
      assetKind: row?.assetKind ?? "other",
      launchNotes: row?.launchNotes ?? "",
    },
  });
  const save = useSave<Input, unknown, Output>({ url: row ? `/api/sites/${row.id}` : "/api/sites", method: row ? "PATCH" : "POST", invalidate: ["sites", "jobs"], setError: form.setError, onDone: onClose });
  const archive = useSave<{ archived: boolean }>({ url: `/api/sites/${row?.id}`, method: "PATCH", invalidate: ["sites"], onDone: onClose });
  const e = form.formState.errors;
  return (
    <Panel open title={row ? `Edit ${row.name}` : "New site"} onClose={onClose}>
      <form className="flex flex-col gap-4" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <SelectField key={clients.data ? "clients-ready" : "clients-loading"} label="Client" {...form.register("clientId")} error={e.clientId?.message} disabled={clients.isLoading}>
          <option value="">{clients.isLoading ? "Loading clients…" : "Choose a client"}</option>
          {clients.data?.items.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <Field label="Site name" {...form.register("name")} error={e.name?.message} />
        <Field label="Address" {...form.register("address")} error={e.address?.message} autoComplete="off" />
        <fieldset className="grid grid-cols-2 gap-3">
          <legend className="mb-1 text-sm font-medium">Position (decimal degrees, WGS 84)</legend>
          <Field label="Latitude" inputMode="decimal" placeholder="54.41237" style={{ fontFamily: "var(--font-mono)" }} unit="°" {...form.register("latitude")} error={e.latitude?.message} />
          <Field label="Longitude" inputMode="decimal" placeholder="-2.61942" style={{ fontFamily: "var(--font-mono)" }} unit="°" {...form.register("longitude")} error={e.longitude?.message} />
        </fieldset>
        <Field
          label="Time zone"
          list="cairn-time-zones"
          hint="Dates for this site are written in this zone (IANA name, e.g. Europe/London)."
          {...form.register("timeZone")}
          error={e.timeZone?.message}
        />
        <datalist id="cairn-time-zones">
          {TIME_ZONES.map((tz) => (
            <option key={tz} value={tz} />
          ))}
        </datalist>
        <SelectField label="Kind of structure" {...form.register("assetKind")} error={e.assetKind?.message}>
          {ASSET_KINDS.map((k) => (
            <option key={k} value={k}>
              {ASSET_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <TextAreaField label="Launch-point notes" placeholder="Where to set up, hazards, access" {...form.register("launchNotes")} error={e.launchNotes?.message} />
        <FormFooter submitLabel={row ? "Save site" : "Create site"} save={save} archive={archive} record={row} />
      </form>
    </Panel>
  );
}

function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC";
  } catch {
    return "UTC";
  }
}
