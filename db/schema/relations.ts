import { relations } from "drizzle-orm";
import { organisations, users, memberships } from "./organisations";
import { clients, sites, jobs, flights } from "./work";
import { recordings, renditions, signalTraces, stills, tags, recordingTags } from "./media";
import { findings, findingRevisions, findingCategories, reports, rangeChecks } from "./review";
import { shareLinks, shareLinkEvents } from "./sharing";

export const organisationsRelations = relations(organisations, ({ many }) => ({ memberships: many(memberships), clients: many(clients) }));
export const usersRelations = relations(users, ({ many }) => ({ memberships: many(memberships) }));
export const membershipsRelations = relations(memberships, ({ one }) => ({
  organisation: one(organisations, { fields: [memberships.organisationId], references: [organisations.id] }),
  user: one(users, { fields: [memberships.userId], references: [users.id] }),
}));
export const clientsRelations = relations(clients, ({ many }) => ({ sites: many(sites) }));
export const sitesRelations = relations(sites, ({ one, many }) => ({
  client: one(clients, { fields: [sites.clientId], references: [clients.id] }),
  jobs: many(jobs),
}));
export const jobsRelations = relations(jobs, ({ one, many }) => ({
  site: one(sites, { fields: [jobs.siteId], references: [sites.id] }),
  pilot: one(users, { fields: [jobs.pilotId], references: [users.id], relationName: "jobPilot" }),
  reviewer: one(users, { fields: [jobs.reviewerId], references: [users.id], relationName: "jobReviewer" }),
  flights: many(flights),
  findings: many(findings),
  reports: many(reports),
  shareLinks: many(shareLinks),
}));
export const flightsRelations = relations(flights, ({ one, many }) => ({
  job: one(jobs, { fields: [flights.jobId], references: [jobs.id] }),
  pilot: one(users, { fields: [flights.pilotId], references: [users.id] }),
  recordings: many(recordings),
  rangeChecks: many(rangeChecks),
}));
export const recordingsRelations = relations(recordings, ({ one, many }) => ({
  flight: one(flights, { fields: [recordings.flightId], references: [flights.id] }),
  job: one(jobs, { fields: [recordings.jobId], references: [jobs.id] }),
  renditions: many(renditions),
  trace: one(signalTraces, { fields: [recordings.id], references: [signalTraces.recordingId] }),
  stills: many(stills),
  tags: many(recordingTags),
  findings: many(findings),
}));
export const renditionsRelations = relations(renditions, ({ one }) => ({
  recording: one(recordings, { fields: [renditions.recordingId], references: [recordings.id] }),
}));
export const stillsRelations = relations(stills, ({ one }) => ({
  recording: one(recordings, { fields: [stills.recordingId], references: [recordings.id] }),
}));
export const recordingTagsRelations = relations(recordingTags, ({ one }) => ({
  recording: one(recordings, { fields: [recordingTags.recordingId], references: [recordings.id] }),
  tag: one(tags, { fields: [recordingTags.tagId], references: [tags.id] }),
}));
export const findingsRelations = relations(findings, ({ one, many }) => ({
  recording: one(recordings, { fields: [findings.recordingId], references: [recordings.id] }),
  job: one(jobs, { fields: [findings.jobId], references: [jobs.id] }),
  category: one(findingCategories, { fields: [findings.categoryId], references: [findingCategories.id] }),
  revisions: many(findingRevisions),
}));
export const findingRevisionsRelations = relations(findingRevisions, ({ one }) => ({
  finding: one(findings, { fields: [findingRevisions.findingId], references: [findings.id] }),
}));
export const reportsRelations = relations(reports, ({ one }) => ({ job: one(jobs, { fields: [reports.jobId], references: [jobs.id] }) }));
export const rangeChecksRelations = relations(rangeChecks, ({ one }) => ({
  flight: one(flights, { fields: [rangeChecks.flightId], references: [flights.id] }),
}));
export const shareLinksRelations = relations(shareLinks, ({ one, many }) => ({
  job: one(jobs, { fields: [shareLinks.jobId], references: [jobs.id] }),
  events: many(shareLinkEvents),
}));
export const shareLinkEventsRelations = relations(shareLinkEvents, ({ one }) => ({
  shareLink: one(shareLinks, { fields: [shareLinkEvents.shareLinkId], references: [shareLinks.id] }),
}));
