// Query parameters of the work lists: the shared search/sort/paging ones plus each list's filters.
// Server-side only (it builds on the API's list query).
import { z } from "zod";
import { listQuery } from "@/lib/api/with-org";
import { ASSET_KINDS, JOB_STATUSES } from "./work";
import { plainText } from "./common";
import { ROLES } from "./members";

const id = z.string().uuid("Not a valid id").optional();
// the shared search text, minus the NUL character PostgreSQL refuses
const search = { q: plainText(200).optional() };

/** "planned,fieldwork" -> ["planned", "fieldwork"]; an unknown word is a 422, not an empty list. */
const csvOf = <T extends readonly [string, ...string[]]>(values: T) =>
  z
    .string()
    .max(200)
    .transform((s) => s.split(",").map((x) => x.trim()).filter(Boolean))
    .pipe(z.array(z.enum(values)))
    .optional();

export const siteListQuery = listQuery.extend({ ...search, clientId: id, assetKind: z.enum(ASSET_KINDS).optional() });
export const jobListQuery = listQuery.extend({ ...search, clientId: id, siteId: id, pilotId: id, reviewerId: id, status: csvOf(JOB_STATUSES) });
export const flightListQuery = listQuery.extend({ ...search, clientId: id, siteId: id, jobId: id, pilotId: id });

export type SiteListQuery = z.infer<typeof siteListQuery>;
export type JobListQuery = z.infer<typeof jobListQuery>;
export type FlightListQuery = z.infer<typeof flightListQuery>;

export const memberListQuery = listQuery.extend({ ...search, role: csvOf(ROLES) });
export type MemberListQuery = z.infer<typeof memberListQuery>;
