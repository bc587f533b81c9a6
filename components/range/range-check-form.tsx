"use client";
// Log or edit one range check. Opened three ways: "New range check", "Edit", and from a signal-trace
// event, where the event and its time are fixed by the trace and the form is prefilled from the flight
// (max altitude, aircraft) for the pilot to confirm and complete with the distance.
import { useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { Panel, FormError } from "@/components/ui/panel";
import { useSave } from "@/components/work/use-save";
import { FetchError } from "@/components/fetch-json";
import { fromMetres } from "@/lib/geo";
import { LINK_EVENTS, LINK_EVENT_META, type LinkEvent } from "@/lib/range-checks/link-events";
import { formatMetresIn } from "@/lib/range-checks/format-figures";
import { formatMomentSec } from "@/components/trace/trace-summary";
import type { RangeFlight } from "@/lib/range-checks/load-range-page-data";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { LinkEventMark } from "./link-event-mark";
import type { RangeCheckRow, TraceEventItem } from "./range-check-types";

export type RangeCheckFormMode =
  | { kind: "new" }
  | { kind: "edit"; row: RangeCheckRow }
  | { kind: "trace"; event: TraceEventItem; prefill: { heightAglM: number | null; aircraft: string | null } };

type Form = {
  event: LinkEvent;
  atSec: string;
  positionBy: "coordinates" | "distance";
  latitude: string;
  longitude: string;
  groundDistance: string;
  bearingDeg: string;
  heightAgl: string;
  antennaOrientation: string;
  cameraOrientation: string;
  aircraft: string;
  firmware: string;
  notes: string;
};

const CAMERA_SUGGESTIONS = ["Pitched up", "Level", "Pitched down"];
const ANTENNA_SUGGESTIONS = ["Vertical", "Horizontal", "Angled 45°"];
export const RANGE_INVALIDATE = ["range-checks", "range-chart", "trace-events"];

const lengthText = (m: number | null | undefined, units: DisplayUnits) => (m === null || m === undefined ? "" : String(Number(fromMetres(m, units).toFixed(3))));
const numText = (n: number | null | undefined) => (n === null || n === undefined ? "" : String(n));

function defaults(mode: RangeCheckFormMode, flight: RangeFlight, units: DisplayUnits): Form {
  const blank: Form = {
    event: "first_degradation",
    atSec: "",
    positionBy: "distance",
    latitude: "",
    longitude: "",
    groundDistance: "",
    bearingDeg: "",
    heightAgl: lengthText(flight.maxAltitudeAglM, units),
    antennaOrientation: "",
    cameraOrientation: "",
    aircraft: flight.aircraft ?? "",
    firmware: "",
    notes: "",
  };
  if (mode.kind === "trace") {
    return { ...blank, event: mode.event.event, atSec: String(mode.event.atSec), heightAgl: lengthText(mode.prefill.heightAglM, units), aircraft: mode.prefill.aircraft ?? "" };
  }
  if (mode.kind === "edit") {
    const r = mode.row;
    return {
      event: r.event,
      atSec: numText(r.atSec),
      positionBy: "distance",
      latitude: numText(r.latitude),
      longitude: numText(r.longitude),
      groundDistance: lengthText(r.groundDistanceM, units),
      bearingDeg: r.bearingDeg === null ? "" : String(Number(r.bearingDeg.toFixed(4))),
      heightAgl: lengthText(r.heightAglM, units),
      antennaOrientation: r.antennaOrientation ?? "",
      cameraOrientation: r.cameraOrientation ?? "",
      aircraft: r.aircraft ?? "",
      firmware: r.firmware ?? "",
      notes: r.notes ?? "",
    };
  }
  return blank;
}

export function RangeCheckForm({ mode, flight, units, onClose }: { mode: RangeCheckFormMode; flight: RangeFlight; units: DisplayUnits; onClose: () => void }) {
  const form = useForm<Form>({ defaultValues: defaults(mode, flight, units) });
  const hasLaunch = flight.launchLatitude !== null && flight.launchLongitude !== null;
  const url = mode.kind === "edit" ? `/api/range-checks/${mode.row.id}` : mode.kind === "trace" ? "/api/range-checks/from-trace" : "/api/range-checks";
  const save = useSave<Record<string, unknown>>({
    url,
    method: mode.kind === "edit" ? "PATCH" : "POST",
    invalidate: RANGE_INVALIDATE,
    setError: form.setError as never,
    onDone: onClose,
  });
  const e = form.formState.errors;
  const positionBy = useWatch({ control: form.control, name: "positionBy" });

  const submit = form.handleSubmit((v) => {
    const common = {
      positionBy: v.positionBy,
      latitude: v.positionBy === "coordinates" ? v.latitude : null,
      longitude: v.positionBy === "coordinates" ? v.longitude : null,
      groundDistance: v.positionBy === "distance" ? v.groundDistance : null,
      bearingDeg: v.positionBy === "distance" ? v.bearingDeg : null,
      heightAgl: v.heightAgl,
      units,
      antennaOrientation: v.antennaOrientation,
      cameraOrientation: v.cameraOrientation,
      aircraft: v.aircraft,
      firmware: v.firmware,
      notes: v.notes,
    };
    if (mode.kind === "trace") save.mutate({ ...common, flightId: flight.id, recordingId: mode.event.recordingId, intervalIndex: mode.event.intervalIndex });
    else if (mode.kind === "edit") save.mutate({ ...common, event: v.event, atSec: v.atSec });
    else save.mutate({ ...common, flightId: flight.id, event: v.event, atSec: v.atSec });
  });

  const title = mode.kind === "edit" ? "Edit range check" : mode.kind === "trace" ? "Log range check from the signal trace" : "New range check";
  return (
    <Panel open title={title} onClose={onClose}>
      <form className="flex flex-col gap-4" onSubmit={submit} noValidate>
        <p className="text-sm text-ink-2">
          Flight of {flight.flownOn}, {flight.jobTitle}. {hasLaunch ? "Distances and bearings are measured from its launch point." : "This flight has no launch point: give a ground distance (coordinates need a launch point to measure from)."}
        </p>
        {mode.kind === "trace" ? (
          <div className="rounded-md border border-line bg-paper-2 p-3 text-sm" data-testid="trace-event-summary">
            <p className="flex flex-wrap items-center gap-2 font-medium">
              <LinkEventMark event={mode.event.event} /> at <span className="font-mono">{formatMomentSec(mode.event.atSec)}</span> of{" "}
              <span className="font-mono">{mode.event.recordingName}</span>
            </p>
            <p className="mt-1 text-xs text-ink-2">
              Taken from the signal trace (interval {mode.event.intervalIndex + 1}, frame {mode.event.atFrame}). The height below is prefilled with the flight&apos;s
              logged maximum{mode.prefill.heightAglM !== null ? ` (${formatMetresIn(mode.prefill.heightAglM, units)})` : ""}: correct it to the height at this moment,
              and give the position.
            </p>
          </div>
        ) : (
          <div className="grid gap-3 sm:grid-cols-2">
            <SelectField label="Link event" {...form.register("event")} error={e.event?.message}>
              {LINK_EVENTS.map((ev) => (
                <option key={ev} value={ev}>
                  {LINK_EVENT_META[ev].symbol} {LINK_EVENT_META[ev].label}
                </option>
              ))}
            </SelectField>
            <Field label="Time into the recording" unit="s" inputMode="decimal" {...form.register("atSec")} error={e.atSec?.message} hint="Optional" />
          </div>
        )}

        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 text-sm font-medium">Position of the aircraft</legend>
          <div className="flex flex-wrap gap-4 text-sm">
            <label className="flex min-h-10 items-center gap-2">
              <input type="radio" value="distance" {...form.register("positionBy")} className="h-4 w-4" />
              Ground distance and bearing
            </label>
            <label className="flex min-h-10 items-center gap-2">
              <input type="radio" value="coordinates" {...form.register("positionBy")} className="h-4 w-4" />
              Coordinates
            </label>
          </div>
          {e.positionBy?.message && (
            <p role="alert" className="text-xs font-medium text-bad">
              {e.positionBy.message}
            </p>
          )}
        </fieldset>
        {positionBy === "coordinates" ? (
          <div className="grid gap-3 sm:grid-cols-2">
            <Field label="Latitude" {...form.register("latitude")} error={e.latitude?.message} hint="54.41012 or 54°24'36.4&quot;N" />
            <Field label="Longitude" {...form.register("longitude")} error={e.longitude?.message} hint="-2.62511 or 2°37'30.4&quot;W" />
          </div>
        ) : (
          <div className="grid gap-3 sm:grid-cols-2">
            <Field label="Ground distance from launch" unit={units} inputMode="decimal" {...form.register("groundDistance")} error={e.groundDistance?.message} />
            <Field label="Bearing from launch" unit="°" inputMode="decimal" {...form.register("bearingDeg")} error={e.bearingDeg?.message} hint="Degrees clockwise from true north. Optional; places the point on the map" />
          </div>
        )}
        <Field label="Height above ground level (AGL)" unit={units} inputMode="decimal" {...form.register("heightAgl")} error={e.heightAgl?.message} hint="Measured from the ground at the launch point; gives the slant range from there" />

        <div className="grid gap-3 sm:grid-cols-2">
          <Field label="Antenna orientation" list="range-antenna-suggestions" {...form.register("antennaOrientation")} error={e.antennaOrientation?.message} />
          <Field label="Camera orientation" list="range-camera-suggestions" {...form.register("cameraOrientation")} error={e.cameraOrientation?.message} />
          <Field label="Aircraft" {...form.register("aircraft")} error={e.aircraft?.message} />
          <Field label="Firmware" {...form.register("firmware")} error={e.firmware?.message} />
        </div>
        <datalist id="range-antenna-suggestions">
          {ANTENNA_SUGGESTIONS.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
        <datalist id="range-camera-suggestions">
          {CAMERA_SUGGESTIONS.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
        <TextAreaField label="Notes" {...form.register("notes")} error={e.notes?.message} />
        <FormError error={save.error} />
        <OtherFieldErrors error={save.error} />
        <div className="flex gap-2">
          <Button type="submit" busy={save.isPending}>
            {mode.kind === "edit" ? "Save range check" : "Log range check"}
          </Button>
          <Button type="button" variant="secondary" onClick={onClose}>
            Cancel
          </Button>
        </div>
      </form>
    </Panel>
  );
}

const FORM_FIELDS = new Set<string>(["event", "atSec", "positionBy", "latitude", "longitude", "groundDistance", "bearingDeg", "heightAgl", "antennaOrientation", "cameraOrientation", "aircraft", "firmware", "notes"]);

/** Refusals about things the form does not show (the recording, the trace interval) still need saying. */
function OtherFieldErrors({ error }: { error: Error | null }) {
  if (!(error instanceof FetchError) || !error.fields) return null;
  const other = Object.entries(error.fields).filter(([k]) => !FORM_FIELDS.has(k));
  if (other.length === 0) return null;
  return (
    <ul role="alert" className="list-disc pl-5 text-sm text-bad">
      {other.map(([k, msgs]) => (
        <li key={k}>{msgs[0]}</li>
      ))}
    </ul>
  );
}
