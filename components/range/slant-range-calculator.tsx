"use client";
// The calculator: launch point and target (typed, or picked on the site plan) or a typed ground
// distance, plus height above ground -> ground distance, slant range and bearing, with the cautions
// beside the result. Figures update as the pilot types; nothing is stored.
import { useMemo, useState } from "react";
import { Field, SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { GeoInputError, formatDecimalDegrees, inverse, parseAngle, slantRange, toDms, toMetres, type Axis, type GeoPoint } from "@/lib/geo";
import { convertTypedLength, formatBearing, formatMetresIn } from "@/lib/range-checks/format-figures";
import type { PlanSite } from "@/lib/range-checks/load-range-page-data";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { RangeTabs } from "./range-tabs";
import { SafetyCautions } from "./safety-cautions";
import { SitePlan } from "./site-plan";
import { UnitsToggle } from "./units-toggle";
import { usePreferredUnits } from "./use-preferred-units";

type Read<T> = { value: T | null; error?: string };

function readAngle(text: string, axis: Axis, label: string): Read<number> {
  if (text.trim() === "") return { value: null };
  try {
    return { value: parseAngle(text, axis, label) };
  } catch (err) {
    return { value: null, error: err instanceof GeoInputError ? err.message : String(err) };
  }
}

function readLength(text: string, what: string): Read<number> {
  if (text.trim() === "") return { value: null };
  const n = Number(text.trim());
  if (!Number.isFinite(n)) return { value: null, error: `${what} must be a number, e.g. 1926 or 587.1` };
  if (n < 0) return { value: null, error: `${what} cannot be negative` };
  return { value: n };
}

const pointOf = (lat: Read<number>, lon: Read<number>): GeoPoint | null => (lat.value !== null && lon.value !== null ? { lat: lat.value, lon: lon.value } : null);

export function SlantRangeCalculator({ sites, initialUnits }: { sites: PlanSite[]; initialUnits: DisplayUnits }) {
  const { units, setUnits, saving, saveError } = usePreferredUnits(initialUnits);
  const [siteId, setSiteId] = useState(sites[0]?.id ?? "");
  const site = sites.find((s) => s.id === siteId) ?? null;
  const [launchLat, setLaunchLat] = useState(site ? formatDecimalDegrees(site.latitude) : "");
  const [launchLon, setLaunchLon] = useState(site ? formatDecimalDegrees(site.longitude) : "");
  const [targetLat, setTargetLat] = useState("");
  const [targetLon, setTargetLon] = useState("");
  const [mode, setMode] = useState<"coordinates" | "distance">("coordinates");
  const [groundText, setGroundText] = useState("");
  const [heightText, setHeightText] = useState("");

  const changeUnits = (next: DisplayUnits) => {
    // typed lengths keep their meaning: 400 ft becomes 121.92 m, not 400 m
    setGroundText((t) => convertTypedLength(t, units, next));
    setHeightText((t) => convertTypedLength(t, units, next));
    void setUnits(next);
  };

  const chooseSite = (id: string) => {
    setSiteId(id);
    const s = sites.find((x) => x.id === id);
    if (s) {
      setLaunchLat(formatDecimalDegrees(s.latitude));
      setLaunchLon(formatDecimalDegrees(s.longitude));
      setTargetLat("");
      setTargetLon("");
    }
  };

  const lLat = readAngle(launchLat, "latitude", "Launch latitude");
  const lLon = readAngle(launchLon, "longitude", "Launch longitude");
  const tLat = readAngle(targetLat, "latitude", "Target latitude");
  const tLon = readAngle(targetLon, "longitude", "Target longitude");
  const ground = readLength(groundText, "Ground distance");
  const height = readLength(heightText, "Height above ground");
  const launch = pointOf(lLat, lLon);
  const target = pointOf(tLat, tLon);

  const result = useMemo(() => {
    const heightM = height.value === null ? null : toMetres(height.value, units);
    let groundM: number | null = null;
    let bearing: { initial: number; final: number } | null = null;
    if (mode === "coordinates" && launch && target) {
      const r = inverse(launch.lat, launch.lon, target.lat, target.lon);
      groundM = r.distanceM;
      bearing = { initial: r.initialBearingDeg, final: r.finalBearingDeg };
    } else if (mode === "distance" && ground.value !== null) {
      groundM = toMetres(ground.value, units);
    }
    const slantM = groundM !== null && heightM !== null ? slantRange({ groundDistance: groundM, heightAgl: heightM }) : null;
    return { heightM, groundM, bearing, slantM };
  }, [mode, launch, target, ground.value, height.value, units]);

  const pick = (p: GeoPoint) => {
    setTargetLat(formatDecimalDegrees(p.lat));
    setTargetLon(formatDecimalDegrees(p.lon));
    setMode("coordinates");
  };

  const missing = [
    mode === "coordinates" && !launch && "a launch point",
    mode === "coordinates" && !target && "a target",
    mode === "distance" && ground.value === null && "a ground distance",
    height.value === null && "the height above ground",
  ].filter(Boolean);

  return (
    <>
      <PageHeader
        title="Range & distance"
        intro="Slant range from the pilot to the aircraft, from a ground distance and a height above ground level. Distances between coordinates are measured on the WGS84 ellipsoid."
        actions={<UnitsToggle units={units} onChange={changeUnits} saving={saving} error={saveError} />}
      />
      <RangeTabs current="calculator" />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,26rem)]">
        <section aria-labelledby="calc-inputs" className="flex flex-col gap-5">
          <h2 id="calc-inputs" className="sr-only">
            Inputs
          </h2>
          <fieldset className="flex flex-col gap-2">
            <legend className="mb-1 text-sm font-medium">Ground distance from</legend>
            <div className="flex flex-wrap gap-4 text-sm">
              <label className="flex min-h-10 items-center gap-2">
                <input type="radio" name="calc-mode" checked={mode === "coordinates"} onChange={() => setMode("coordinates")} className="h-4 w-4" />
                Launch point and target coordinates
              </label>
              <label className="flex min-h-10 items-center gap-2">
                <input type="radio" name="calc-mode" checked={mode === "distance"} onChange={() => setMode("distance")} className="h-4 w-4" />
                A ground distance I measured
              </label>
            </div>
          </fieldset>

          <Field
            label="Height above ground level (AGL)"
            unit={units}
            inputMode="decimal"
            value={heightText}
            onChange={(e) => setHeightText(e.target.value)}
            error={height.error}
            hint="Height of the aircraft above the ground at the pilot's position."
          />

          {mode === "distance" ? (
            <Field
              label="Ground distance"
              unit={units}
              inputMode="decimal"
              value={groundText}
              onChange={(e) => setGroundText(e.target.value)}
              error={ground.error}
              hint="Horizontal distance from the pilot to the point under the aircraft."
            />
          ) : (
            <>
              {sites.length > 0 && (
                <SelectField label="Site (draws the plan)" value={siteId} onChange={(e) => chooseSite(e.target.value)}>
                  {sites.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                    </option>
                  ))}
                </SelectField>
              )}
              <div className="grid gap-3 sm:grid-cols-2">
                <Field label="Launch latitude" value={launchLat} onChange={(e) => setLaunchLat(e.target.value)} error={lLat.error} hint="Decimal (54.41301) or DMS (54°24'46.8&quot;N)" />
                <Field label="Launch longitude" value={launchLon} onChange={(e) => setLaunchLon(e.target.value)} error={lLon.error} hint="Decimal (-2.61955) or DMS (2°37'10.4&quot;W)" />
                <Field label="Target latitude" value={targetLat} onChange={(e) => setTargetLat(e.target.value)} error={tLat.error} />
                <Field label="Target longitude" value={targetLon} onChange={(e) => setTargetLon(e.target.value)} error={tLon.error} />
              </div>
              {site ? (
                <SitePlan key={site.id} centre={{ lat: site.latitude, lon: site.longitude }} siteName={site.name} launch={launch} target={target} units={units} onPickTarget={pick} />
              ) : (
                <p className="text-sm text-ink-2">Add coordinates to a site to pick the target on its plan; typed coordinates work without one.</p>
              )}
            </>
          )}
        </section>

        <section aria-labelledby="calc-result" className="flex flex-col gap-4">
          <div className="rounded-lg border border-line bg-paper-2 p-4">
            <h2 id="calc-result" className="text-sm font-medium text-ink-2">
              Slant range
            </h2>
            <p className="mt-1 font-mono text-3xl tabular" data-testid="slant-range" aria-live="polite">
              {result.slantM !== null ? formatMetresIn(result.slantM, units) : "—"}
            </p>
            {result.slantM === null && missing.length > 0 && <p className="mt-1 text-sm text-ink-2">Give {missing.join(" and ")} to compute it.</p>}
            <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
              <dt className="text-ink-2">Ground distance</dt>
              <dd className="font-mono tabular" data-testid="ground-distance">
                {result.groundM !== null ? formatMetresIn(result.groundM, units) : "—"}
              </dd>
              <dt className="text-ink-2">Height AGL</dt>
              <dd className="font-mono tabular">{result.heightM !== null ? formatMetresIn(result.heightM, units) : "—"}</dd>
              <dt className="text-ink-2">Initial bearing</dt>
              <dd className="font-mono tabular" data-testid="bearing">
                {result.bearing ? formatBearing(result.bearing.initial) : mode === "distance" ? "— (needs coordinates)" : "—"}
              </dd>
              {result.bearing && (
                <>
                  <dt className="text-ink-2">Final bearing</dt>
                  <dd className="font-mono tabular">{formatBearing(result.bearing.final)}</dd>
                </>
              )}
              {result.slantM !== null && (
                <>
                  <dt className="text-ink-2">In {units === "ft" ? "metres" : "feet"}</dt>
                  <dd className="font-mono tabular">{formatMetresIn(result.slantM, units === "ft" ? "m" : "ft")}</dd>
                </>
              )}
              {target && mode === "coordinates" && (
                <>
                  <dt className="text-ink-2">Target (DMS)</dt>
                  <dd className="font-mono text-xs">
                    {toDms(target.lat, "latitude")} {toDms(target.lon, "longitude")}
                  </dd>
                </>
              )}
            </dl>
            <p className="mt-3 text-xs text-ink-2">
              Slant range = √(ground distance² + height²), over flat ground from the pilot&apos;s position. 1 ft = 0.3048 m exactly.
            </p>
          </div>
          <SafetyCautions heightAglM={result.heightM} />
        </section>
      </div>
    </>
  );
}
