CREATE TYPE "public"."evidence_package_state" AS ENUM('queued', 'building', 'ready', 'failed', 'expired');--> statement-breakpoint
CREATE TABLE "disposal_reminders" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"disposal_date" date NOT NULL,
	"lead_days" integer NOT NULL,
	"recipients" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "evidence_packages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"flight_id" uuid,
	"recording_ids" jsonb,
	"state" "evidence_package_state" DEFAULT 'queued' NOT NULL,
	"progress" integer DEFAULT 0 NOT NULL,
	"estimated_bytes" bigint NOT NULL,
	"storage_key" text,
	"size_bytes" bigint,
	"sha256" text,
	"payload_files" integer,
	"payload_bytes" bigint,
	"purpose" text,
	"failure_reason" text,
	"created_by" uuid,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "retention_days" integer;--> statement-breakpoint
ALTER TABLE "clients" ADD COLUMN "retention_days" integer;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "retention_days" integer;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "closed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "disposed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "disposed_by" uuid;--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "evidence_package_id" uuid;--> statement-breakpoint
ALTER TABLE "disposal_reminders" ADD CONSTRAINT "disposal_reminders_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "disposal_reminders" ADD CONSTRAINT "disposal_reminders_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packages" ADD CONSTRAINT "evidence_packages_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packages" ADD CONSTRAINT "evidence_packages_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packages" ADD CONSTRAINT "evidence_packages_flight_id_flights_id_fk" FOREIGN KEY ("flight_id") REFERENCES "public"."flights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evidence_packages" ADD CONSTRAINT "evidence_packages_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "disposal_reminders_job_date_lead_uq" ON "disposal_reminders" USING btree ("job_id","disposal_date","lead_days");--> statement-breakpoint
CREATE INDEX "disposal_reminders_org_idx" ON "disposal_reminders" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "evidence_packages_org_job_idx" ON "evidence_packages" USING btree ("organisation_id","job_id");--> statement-breakpoint
CREATE INDEX "evidence_packages_state_idx" ON "evidence_packages" USING btree ("state","expires_at");--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_disposed_by_users_id_fk" FOREIGN KEY ("disposed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_evidence_package_id_evidence_packages_id_fk" FOREIGN KEY ("evidence_package_id") REFERENCES "public"."evidence_packages"("id") ON DELETE no action ON UPDATE no action;