CREATE TYPE "public"."asset_kind" AS ENUM('roof', 'tower', 'bridge', 'solar', 'facade', 'other');--> statement-breakpoint
CREATE TYPE "public"."job_status" AS ENUM('planned', 'fieldwork', 'review', 'delivered', 'closed');--> statement-breakpoint
CREATE TYPE "public"."link_event" AS ENUM('first_degradation', 'total_loss', 'reacquired');--> statement-breakpoint
CREATE TYPE "public"."processing_state" AS ENUM('waiting', 'processing', 'ready', 'failed');--> statement-breakpoint
CREATE TYPE "public"."recording_kind" AS ENUM('raw_h264', 'mp4', 'mov', 'jpeg');--> statement-breakpoint
CREATE TYPE "public"."rendition_kind" AS ENUM('playable', 'poster', 'sprite', 'thumbnails_vtt');--> statement-breakpoint
CREATE TYPE "public"."report_state" AS ENUM('queued', 'building', 'ready', 'approved', 'failed');--> statement-breakpoint
CREATE TYPE "public"."revision_action" AS ENUM('created', 'updated', 'deleted');--> statement-breakpoint
CREATE TYPE "public"."member_role" AS ENUM('owner', 'pilot', 'reviewer', 'client');--> statement-breakpoint
CREATE TYPE "public"."finding_severity" AS ENUM('note', 'minor', 'moderate', 'major', 'severe', 'critical');--> statement-breakpoint
CREATE TYPE "public"."share_event_kind" AS ENUM('open', 'download', 'passcode_refused', 'media');--> statement-breakpoint
CREATE TYPE "public"."share_scope" AS ENUM('recording', 'findings', 'report', 'job');--> statement-breakpoint
CREATE TYPE "public"."still_state" AS ENUM('pending', 'ready', 'failed');--> statement-breakpoint
CREATE TYPE "public"."length_units" AS ENUM('ft', 'm');--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"email" text NOT NULL,
	"role" "member_role" NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by" uuid,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"revoked" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invitations_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "memberships" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"role" "member_role" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "organisations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"slug" text NOT NULL,
	"default_controller_fps" double precision DEFAULT 30 NOT NULL,
	"storage_quota_bytes" bigint,
	"time_zone" text DEFAULT 'UTC' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisations_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"password_hash" text,
	"email_verified_at" timestamp with time zone,
	"preferred_units" "length_units" DEFAULT 'ft' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "verification_tokens" (
	"identifier" text NOT NULL,
	"token" text NOT NULL,
	"expires" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "clients" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"contact_name" text,
	"contact_email" text,
	"notes" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "flights" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"flown_on" date NOT NULL,
	"pilot_id" uuid,
	"aircraft" text,
	"launch_latitude" double precision,
	"launch_longitude" double precision,
	"launch_notes" text,
	"max_altitude_agl_m" double precision,
	"notes" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"title" text NOT NULL,
	"scope" text,
	"due_date" date,
	"status" "job_status" DEFAULT 'planned' NOT NULL,
	"pilot_id" uuid,
	"reviewer_id" uuid,
	"legal_hold" boolean DEFAULT false NOT NULL,
	"legal_hold_reason" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"name" text NOT NULL,
	"address" text,
	"latitude" double precision,
	"longitude" double precision,
	"time_zone" text DEFAULT 'UTC' NOT NULL,
	"asset_kind" "asset_kind" DEFAULT 'other' NOT NULL,
	"launch_notes" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "playback_views" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"recording_id" uuid NOT NULL,
	"view_key" text NOT NULL,
	"viewer_user_id" uuid,
	"share_link_id" uuid,
	"started_at" timestamp with time zone NOT NULL,
	"last_beacon_at" timestamp with time zone NOT NULL,
	"watch_time_ms" integer DEFAULT 0 NOT NULL,
	"startup_time_ms" integer,
	"rebuffer_count" integer DEFAULT 0 NOT NULL,
	"rebuffer_ms" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recording_tags" (
	"organisation_id" uuid NOT NULL,
	"recording_id" uuid NOT NULL,
	"tag_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recording_tags_recording_id_tag_id_pk" PRIMARY KEY("recording_id","tag_id")
);
--> statement-breakpoint
CREATE TABLE "recordings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"flight_id" uuid NOT NULL,
	"upload_id" text,
	"original_name" text NOT NULL,
	"relative_path" text,
	"size_bytes" bigint NOT NULL,
	"kind" "recording_kind" NOT NULL,
	"sha256" text NOT NULL,
	"storage_key" text,
	"duplicate_of_id" uuid,
	"uploaded_by" uuid,
	"recorder_modified_at" timestamp with time zone,
	"sequence_index" integer DEFAULT 0 NOT NULL,
	"state" "processing_state" DEFAULT 'waiting' NOT NULL,
	"progress" integer DEFAULT 0 NOT NULL,
	"failure_reason" text,
	"fps_override" double precision,
	"facts" jsonb,
	"duration_sec" double precision,
	"processed_at" timestamp with time zone,
	"deleted_at" timestamp with time zone,
	"deleted_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recordings_upload_id_unique" UNIQUE("upload_id")
);
--> statement-breakpoint
CREATE TABLE "renditions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"recording_id" uuid NOT NULL,
	"kind" "rendition_kind" NOT NULL,
	"storage_key" text NOT NULL,
	"mime_type" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"width" integer,
	"height" integer,
	"tool" text,
	"tool_args" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "signal_traces" (
	"recording_id" uuid PRIMARY KEY NOT NULL,
	"organisation_id" uuid NOT NULL,
	"fps" double precision NOT NULL,
	"intervals" jsonb NOT NULL,
	"summary" jsonb NOT NULL,
	"decoder_error_frames" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "stills" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"recording_id" uuid NOT NULL,
	"finding_id" uuid,
	"frame_number" integer NOT NULL,
	"time_sec" double precision NOT NULL,
	"state" "still_state" DEFAULT 'pending' NOT NULL,
	"storage_key" text,
	"width" integer,
	"height" integer,
	"sha256" text,
	"failure_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tags" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "finding_categories" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"asset_kind" "asset_kind",
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "finding_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"finding_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"action" "revision_action" NOT NULL,
	"snapshot" jsonb NOT NULL,
	"edited_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "findings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"recording_id" uuid NOT NULL,
	"start_frame" integer NOT NULL,
	"end_frame" integer,
	"start_sec" double precision NOT NULL,
	"end_sec" double precision,
	"severity" "finding_severity" NOT NULL,
	"category_id" uuid,
	"note" text DEFAULT '' NOT NULL,
	"box" jsonb,
	"latitude" double precision,
	"longitude" double precision,
	"ground_distance_m" double precision,
	"slant_distance_m" double precision,
	"height_agl_m" double precision,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid,
	"deleted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "range_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"flight_id" uuid NOT NULL,
	"recording_id" uuid,
	"event" "link_event" NOT NULL,
	"at_sec" double precision,
	"latitude" double precision,
	"longitude" double precision,
	"ground_distance_m" double precision NOT NULL,
	"bearing_deg" double precision,
	"height_agl_m" double precision NOT NULL,
	"slant_range_m" double precision NOT NULL,
	"antenna_orientation" text,
	"camera_orientation" text,
	"aircraft" text,
	"firmware" text,
	"notes" text,
	"created_by" uuid,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"state" "report_state" DEFAULT 'queued' NOT NULL,
	"progress" integer DEFAULT 0 NOT NULL,
	"storage_key" text,
	"size_bytes" bigint,
	"sha256" text,
	"failure_reason" text,
	"created_by" uuid,
	"approved_by" uuid,
	"approved_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "custody_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"seq" bigint NOT NULL,
	"event_type" text NOT NULL,
	"evidence_type" text NOT NULL,
	"evidence_id" uuid,
	"job_id" uuid,
	"original_sha256" text,
	"original_size" bigint,
	"actor_user_id" uuid,
	"actor_role" "member_role",
	"actor_share_link_id" uuid,
	"occurred_at" timestamp (3) with time zone NOT NULL,
	"client_address" text,
	"user_agent" text,
	"storage_location" text,
	"purpose" text,
	"tool" text,
	"tool_args" jsonb,
	"output_sha256" text,
	"details" jsonb,
	"prev_hash" text NOT NULL,
	"hash" text NOT NULL
);
--> statement-breakpoint
CREATE TABLE "share_link_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"share_link_id" uuid NOT NULL,
	"kind" "share_event_kind" NOT NULL,
	"detail" text,
	"client_address" text,
	"user_agent" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "share_links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"scope" "share_scope" NOT NULL,
	"recording_id" uuid,
	"report_id" uuid,
	"finding_ids" jsonb,
	"token_hash" text NOT NULL,
	"label" text NOT NULL,
	"recipient_emails" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"passcode_hash" text,
	"failed_passcode_attempts" integer DEFAULT 0 NOT NULL,
	"locked_until" timestamp with time zone,
	"allow_originals" boolean DEFAULT false NOT NULL,
	"revoked_at" timestamp with time zone,
	"revoked_by" uuid,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "share_links_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_users_id_fk" FOREIGN KEY ("invited_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clients" ADD CONSTRAINT "clients_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flights" ADD CONSTRAINT "flights_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flights" ADD CONSTRAINT "flights_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flights" ADD CONSTRAINT "flights_pilot_id_users_id_fk" FOREIGN KEY ("pilot_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_pilot_id_users_id_fk" FOREIGN KEY ("pilot_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "playback_views" ADD CONSTRAINT "playback_views_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "playback_views" ADD CONSTRAINT "playback_views_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "playback_views" ADD CONSTRAINT "playback_views_viewer_user_id_users_id_fk" FOREIGN KEY ("viewer_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recording_tags" ADD CONSTRAINT "recording_tags_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recording_tags" ADD CONSTRAINT "recording_tags_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recording_tags" ADD CONSTRAINT "recording_tags_tag_id_tags_id_fk" FOREIGN KEY ("tag_id") REFERENCES "public"."tags"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_flight_id_flights_id_fk" FOREIGN KEY ("flight_id") REFERENCES "public"."flights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_deleted_by_users_id_fk" FOREIGN KEY ("deleted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "renditions" ADD CONSTRAINT "renditions_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "renditions" ADD CONSTRAINT "renditions_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signal_traces" ADD CONSTRAINT "signal_traces_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signal_traces" ADD CONSTRAINT "signal_traces_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stills" ADD CONSTRAINT "stills_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stills" ADD CONSTRAINT "stills_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tags" ADD CONSTRAINT "tags_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_categories" ADD CONSTRAINT "finding_categories_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_revisions" ADD CONSTRAINT "finding_revisions_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_revisions" ADD CONSTRAINT "finding_revisions_finding_id_findings_id_fk" FOREIGN KEY ("finding_id") REFERENCES "public"."findings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_revisions" ADD CONSTRAINT "finding_revisions_edited_by_users_id_fk" FOREIGN KEY ("edited_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_category_id_finding_categories_id_fk" FOREIGN KEY ("category_id") REFERENCES "public"."finding_categories"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_checks" ADD CONSTRAINT "range_checks_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_checks" ADD CONSTRAINT "range_checks_flight_id_flights_id_fk" FOREIGN KEY ("flight_id") REFERENCES "public"."flights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_checks" ADD CONSTRAINT "range_checks_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_checks" ADD CONSTRAINT "range_checks_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_approved_by_users_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "custody_events" ADD CONSTRAINT "custody_events_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_link_events" ADD CONSTRAINT "share_link_events_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_link_events" ADD CONSTRAINT "share_link_events_share_link_id_share_links_id_fk" FOREIGN KEY ("share_link_id") REFERENCES "public"."share_links"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_report_id_reports_id_fk" FOREIGN KEY ("report_id") REFERENCES "public"."reports"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_revoked_by_users_id_fk" FOREIGN KEY ("revoked_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "invitations_org_idx" ON "invitations" USING btree ("organisation_id","email");--> statement-breakpoint
CREATE UNIQUE INDEX "memberships_org_user_uq" ON "memberships" USING btree ("organisation_id","user_id");--> statement-breakpoint
CREATE INDEX "memberships_user_idx" ON "memberships" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "verification_tokens_uq" ON "verification_tokens" USING btree ("identifier","token");--> statement-breakpoint
CREATE INDEX "clients_org_name_idx" ON "clients" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "flights_org_job_idx" ON "flights" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE INDEX "flights_org_date_idx" ON "flights" USING btree ("organisation_id","flown_on");--> statement-breakpoint
CREATE INDEX "jobs_org_status_idx" ON "jobs" USING btree ("organisation_id","status");--> statement-breakpoint
CREATE INDEX "jobs_org_site_idx" ON "jobs" USING btree ("organisation_id","site_id");--> statement-breakpoint
CREATE INDEX "jobs_org_due_idx" ON "jobs" USING btree ("organisation_id","due_date");--> statement-breakpoint
CREATE INDEX "sites_org_client_idx" ON "sites" USING btree ("organisation_id","client_id");--> statement-breakpoint
CREATE INDEX "sites_org_name_idx" ON "sites" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "playback_views_key_uq" ON "playback_views" USING btree ("view_key");--> statement-breakpoint
CREATE INDEX "playback_views_org_recording_idx" ON "playback_views" USING btree ("organisation_id","recording_id");--> statement-breakpoint
CREATE INDEX "recording_tags_tag_idx" ON "recording_tags" USING btree ("organisation_id","tag_id");--> statement-breakpoint
CREATE INDEX "recordings_org_flight_idx" ON "recordings" USING btree ("organisation_id","flight_id","sequence_index");--> statement-breakpoint
CREATE INDEX "recordings_org_job_idx" ON "recordings" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE INDEX "recordings_org_sha_idx" ON "recordings" USING btree ("organisation_id","sha256");--> statement-breakpoint
CREATE INDEX "recordings_state_idx" ON "recordings" USING btree ("state");--> statement-breakpoint
CREATE UNIQUE INDEX "renditions_recording_kind_uq" ON "renditions" USING btree ("recording_id","kind");--> statement-breakpoint
CREATE INDEX "stills_org_recording_idx" ON "stills" USING btree ("organisation_id","recording_id");--> statement-breakpoint
CREATE INDEX "stills_finding_idx" ON "stills" USING btree ("finding_id");--> statement-breakpoint
CREATE UNIQUE INDEX "tags_org_name_uq" ON "tags" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "finding_categories_org_name_uq" ON "finding_categories" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "finding_revisions_uq" ON "finding_revisions" USING btree ("finding_id","version");--> statement-breakpoint
CREATE INDEX "findings_org_job_idx" ON "findings" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE INDEX "findings_org_recording_idx" ON "findings" USING btree ("organisation_id","recording_id","start_sec");--> statement-breakpoint
CREATE INDEX "findings_org_severity_idx" ON "findings" USING btree ("organisation_id","severity");--> statement-breakpoint
CREATE INDEX "range_checks_org_flight_idx" ON "range_checks" USING btree ("organisation_id","flight_id");--> statement-breakpoint
CREATE UNIQUE INDEX "reports_job_version_uq" ON "reports" USING btree ("job_id","version");--> statement-breakpoint
CREATE INDEX "reports_org_job_idx" ON "reports" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "custody_events_org_seq_uq" ON "custody_events" USING btree ("organisation_id","seq");--> statement-breakpoint
CREATE INDEX "custody_events_org_evidence_idx" ON "custody_events" USING btree ("organisation_id","evidence_id");--> statement-breakpoint
CREATE INDEX "custody_events_org_job_idx" ON "custody_events" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE INDEX "share_link_events_link_idx" ON "share_link_events" USING btree ("organisation_id","share_link_id","created_at");--> statement-breakpoint
CREATE INDEX "share_links_org_job_idx" ON "share_links" USING btree ("organisation_id","job_id");