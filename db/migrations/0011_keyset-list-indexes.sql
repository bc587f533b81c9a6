DROP INDEX "clients_org_name_idx";--> statement-breakpoint
DROP INDEX "flights_org_job_idx";--> statement-breakpoint
DROP INDEX "flights_org_date_idx";--> statement-breakpoint
DROP INDEX "jobs_org_due_idx";--> statement-breakpoint
DROP INDEX "sites_org_name_idx";--> statement-breakpoint
DROP INDEX "playback_views_org_recording_idx";--> statement-breakpoint
DROP INDEX "recordings_org_flight_idx";--> statement-breakpoint
DROP INDEX "recordings_org_job_idx";--> statement-breakpoint
DROP INDEX "share_links_org_job_idx";--> statement-breakpoint
CREATE INDEX "recordings_org_seq_idx" ON "recordings" USING btree ("organisation_id","sequence_index","created_at","id");--> statement-breakpoint
CREATE INDEX "findings_org_recording_frame_idx" ON "findings" USING btree ("organisation_id","recording_id","start_frame","created_at","id");--> statement-breakpoint
CREATE INDEX "clients_org_name_idx" ON "clients" USING btree ("organisation_id","name","id");--> statement-breakpoint
CREATE INDEX "flights_org_job_idx" ON "flights" USING btree ("organisation_id","job_id","flown_on","created_at","id");--> statement-breakpoint
CREATE INDEX "flights_org_date_idx" ON "flights" USING btree ("organisation_id","flown_on","created_at","id");--> statement-breakpoint
CREATE INDEX "jobs_org_due_idx" ON "jobs" USING btree ("organisation_id","due_date","id");--> statement-breakpoint
CREATE INDEX "sites_org_name_idx" ON "sites" USING btree ("organisation_id","name","id");--> statement-breakpoint
CREATE INDEX "playback_views_org_recording_idx" ON "playback_views" USING btree ("organisation_id","recording_id","started_at","id");--> statement-breakpoint
CREATE INDEX "recordings_org_flight_idx" ON "recordings" USING btree ("organisation_id","flight_id","sequence_index","created_at","id");--> statement-breakpoint
CREATE INDEX "recordings_org_job_idx" ON "recordings" USING btree ("organisation_id","job_id","sequence_index","created_at","id");--> statement-breakpoint
CREATE INDEX "share_links_org_job_idx" ON "share_links" USING btree ("organisation_id","job_id","created_at","id");