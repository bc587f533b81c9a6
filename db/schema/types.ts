// Row types inferred from the schema: Recording for reads, NewRecording for inserts.
import type { InferSelectModel, InferInsertModel } from "drizzle-orm";
import * as s from "./index";

export type Organisation = InferSelectModel<typeof s.organisations>;
export type User = InferSelectModel<typeof s.users>;
export type Membership = InferSelectModel<typeof s.memberships>;
export type Client = InferSelectModel<typeof s.clients>;
export type NewClient = InferInsertModel<typeof s.clients>;
export type Site = InferSelectModel<typeof s.sites>;
export type NewSite = InferInsertModel<typeof s.sites>;
export type Job = InferSelectModel<typeof s.jobs>;
export type NewJob = InferInsertModel<typeof s.jobs>;
export type Flight = InferSelectModel<typeof s.flights>;
export type NewFlight = InferInsertModel<typeof s.flights>;
export type Recording = InferSelectModel<typeof s.recordings>;
export type NewRecording = InferInsertModel<typeof s.recordings>;
export type Rendition = InferSelectModel<typeof s.renditions>;
export type Still = InferSelectModel<typeof s.stills>;
export type Finding = InferSelectModel<typeof s.findings>;
export type NewFinding = InferInsertModel<typeof s.findings>;
export type Report = InferSelectModel<typeof s.reports>;
export type RangeCheck = InferSelectModel<typeof s.rangeChecks>;
export type ShareLink = InferSelectModel<typeof s.shareLinks>;
export type CustodyEvent = InferSelectModel<typeof s.custodyEvents>;
export type CustodyCheckpoint = InferSelectModel<typeof s.custodyCheckpoints>;
export type Role = Membership["role"];
export type EvidencePackage = InferSelectModel<typeof s.evidencePackages>;
