// Validation of clients, sites, jobs and flights.
import { z } from "zod";
import { name, optionalText, optionalEmail, uuid, optionalUuid, isoDate, optionalIsoDate, optionalNumber, latitude, longitude } from "./common";

export const ASSET_KINDS = ["roof", "tower", "bridge", "solar", "facade", "other"] as const;
export const JOB_STATUSES = ["planned", "fieldwork", "review", "delivered", "closed"] as const;
export const JOB_STATUS_MEANING: Record<(typeof JOB_STATUSES)[number], { label: string; meaning: string }> = {
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

const withCoordinatePair = <T extends { latitude?: number | null; longitude?: number | null }>(v: T, ctx: z.RefinementCtx) => {
  if ((v.latitude == null) !== (v.longitude == null)) {
    ctx.addIssue({ code: "custom", path: [v.latitude == null ? "latitude" : "longitude"], message: "Give both latitude and longitude, or neither" });
  }
};

export const clientInput = z.object({
  name: name(),
  contactName: optionalText(120),
  contactEmail: optionalEmail,
  notes: optionalText(),
});

export const siteInput = z
  .object({
    clientId: uuid,
    name: name(),
    address: optionalText(300),
    latitude,
    longitude,
    timeZone: z.string().trim().max(60).optional().default("UTC").refine((tz) => isTimeZone(tz), "Unknown time zone"),
    assetKind: z.enum(ASSET_KINDS).default("other"),
    launchNotes: optionalText(),
  })
  .superRefine(withCoordinatePair);

export const jobInput = z.object({
  siteId: uuid,
  title: name(160),
  scope: optionalText(4000),
  dueDate: optionalIsoDate,
  status: z.enum(JOB_STATUSES).default("planned"),
  pilotId: optionalUuid,
  reviewerId: optionalUuid,
});

export const flightInput = z
  .object({
    jobId: uuid,
    flownOn: isoDate,
    pilotId: optionalUuid,
    aircraft: optionalText(120),
    launchLatitude: latitude,
    launchLongitude: longitude,
    launchNotes: optionalText(),
    // metres above ground level; the form converts from the user's units
    maxAltitudeAglM: optionalNumber(0, 10000, "Max altitude"),
    notes: optionalText(),
  })
  .superRefine((v, ctx) => withCoordinatePair({ latitude: v.launchLatitude, longitude: v.launchLongitude }, ctx));

export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

export type ClientInput = z.infer<typeof clientInput>;
export type SiteInput = z.infer<typeof siteInput>;
export type JobInput = z.infer<typeof jobInput>;
export type FlightInput = z.infer<typeof flightInput>;
