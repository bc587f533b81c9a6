// Validation of clients, sites, jobs and flights. The same schemas check the forms in the browser and
// the bodies in the route handlers. Create schemas fill defaults; patch schemas never do, so a PATCH
// that leaves a field out leaves it unchanged.
import { z } from "zod";
import { name, optionalText, optionalEmail, uuid, optionalUuid, isoDate, optionalIsoDate, optionalNumber, latitude, longitude } from "./common";

export const ASSET_KINDS = ["roof", "tower", "bridge", "solar", "facade", "other"] as const;
export const JOB_STATUSES = ["planned", "fieldwork", "review", "delivered", "closed"] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];
export const JOB_STATUS_MEANING: Record<JobStatus, { label: string; meaning: string }> = {
  planned: { label: "Planned", meaning: "Agreed with the client; nothing flown yet." },
  fieldwork: { label: "Fieldwork", meaning: "Flights are being flown and recordings uploaded." },
  review: { label: "In review", meaning: "Reviewers are marking findings in the recordings." },
  delivered: { label: "Delivered", meaning: "The report has been approved and shared with the client." },
  closed: { label: "Closed", meaning: "Finished; kept for the retention period." },
};
export const ASSET_KIND_LABELS: Record<(typeof ASSET_KINDS)[number], string> = {
  roof: "Roof",
  tower: "Tower or mast",
  bridge: "Bridge",
  solar: "Solar array",
  facade: "Building facade",
  other: "Other structure",
};

/** Highest altitude a form accepts, in metres: far above any legal flight, low enough to catch a typo in units. */
export const MAX_ALTITUDE_AGL_M = 10000;

export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

/** The IANA name the runtime resolves a zone to ("europe/london" -> "Europe/London", "US/Eastern" -> "America/New_York"). */
export function canonicalTimeZone(tz: string): string {
  return new Intl.DateTimeFormat("en", { timeZone: tz }).resolvedOptions().timeZone;
}

/** Rejects one coordinate without the other: half a position is worse than none. */
export function coordinatePairIssue(lat: number | null | undefined, lon: number | null | undefined, fields: [string, string]) {
  if ((lat == null) === (lon == null)) return null;
  return { field: lat == null ? fields[0] : fields[1], message: "Give both latitude and longitude, or neither" };
}

const pairRule =
  (fields: [string, string]) =>
  (v: Record<string, unknown>, ctx: z.RefinementCtx) => {
    const issue = coordinatePairIssue(v[fields[0]] as number | null, v[fields[1]] as number | null, fields);
    if (issue) ctx.addIssue({ code: "custom", path: [issue.field], message: issue.message });
  };

const timeZone = z
  .string()
  .trim()
  .min(1, { message: "Required", abort: true })
  .max(60, { message: "At most 60 characters", abort: true })
  .refine(isTimeZone, "Unknown time zone: use an IANA name such as Europe/London")
  .transform(canonicalTimeZone);

const archived = z.boolean().optional();

/** Today's date in UTC plus `days`, as YYYY-MM-DD. */
export const isoDayFromNow = (days: number, now = Date.now()) => new Date(now + days * 86_400_000).toISOString().slice(0, 10);

// A site's local date can run up to 14 h ahead of UTC, so "tomorrow in UTC" is the latest real flight date.
const flightDate = isoDate.refine((s) => s <= isoDayFromNow(1), "A flight cannot be dated in the future");

export const clientInput = z.object({
  name: name(),
  contactName: optionalText(120),
  contactEmail: optionalEmail,
  notes: optionalText(2000, true),
});

const siteFields = {
  clientId: uuid,
  name: name(),
  address: optionalText(300),
  latitude,
  longitude,
  timeZone,
  assetKind: z.enum(ASSET_KINDS),
  launchNotes: optionalText(2000, true),
};
export const siteInput = z
  .object({ ...siteFields, timeZone: timeZone.default("UTC"), assetKind: siteFields.assetKind.default("other") })
  .superRefine(pairRule(["latitude", "longitude"]));
export const clientPatch = clientInput.partial().extend({ archived }).strict();
export const sitePatch = z.object(siteFields).partial().extend({ archived }).strict();

const jobFields = {
  siteId: uuid,
  title: name(160),
  scope: optionalText(4000, true),
  dueDate: optionalIsoDate,
  status: z.enum(JOB_STATUSES),
  pilotId: optionalUuid,
  reviewerId: optionalUuid,
};
export const jobInput = z.object({ ...jobFields, status: jobFields.status.default("planned") });
export const jobPatch = z.object(jobFields).partial().extend({ archived }).strict();

export const flightFields = {
  jobId: uuid,
  flownOn: flightDate,
  pilotId: optionalUuid,
  aircraft: optionalText(120),
  launchLatitude: latitude,
  launchLongitude: longitude,
  launchNotes: optionalText(2000, true),
  // metres above ground level; the form converts from the user's units
  maxAltitudeAglM: optionalNumber(0, MAX_ALTITUDE_AGL_M, "Max altitude"),
  notes: optionalText(2000, true),
};
export const FLIGHT_LAUNCH_PAIR: [string, string] = ["launchLatitude", "launchLongitude"];
export const flightInput = z.object(flightFields).superRefine(pairRule(FLIGHT_LAUNCH_PAIR));
export const flightPatch = z.object(flightFields).partial().extend({ archived }).strict();

export type ClientInput = z.infer<typeof clientInput>;
export type SiteInput = z.infer<typeof siteInput>;
export type SitePatch = z.infer<typeof sitePatch>;
export type JobInput = z.infer<typeof jobInput>;
export type JobPatch = z.infer<typeof jobPatch>;
export type FlightInput = z.infer<typeof flightInput>;
export type FlightPatch = z.infer<typeof flightPatch>;
