CREATE TABLE "flight_tracks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"job_id" uuid NOT NULL,
	"flight_id" uuid NOT NULL,
	"original_name" text NOT NULL,
	"format" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"storage_key" text NOT NULL,
	"point_count" integer NOT NULL,
	"starts_at" timestamp (3) with time zone NOT NULL,
	"ends_at" timestamp (3) with time zone NOT NULL,
	"height_source" text NOT NULL,
	"points" jsonb NOT NULL,
	"warnings" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "track_alignments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"track_id" uuid NOT NULL,
	"offset_ms" double precision NOT NULL,
	"method" text NOT NULL,
	"recording_id" uuid,
	"frame" integer,
	"point_index" integer,
	"uncertainty_ms" double precision NOT NULL,
	"set_by" uuid,
	"created_at" timestamp (3) with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "flight_tracks" ADD CONSTRAINT "flight_tracks_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flight_tracks" ADD CONSTRAINT "flight_tracks_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flight_tracks" ADD CONSTRAINT "flight_tracks_flight_id_flights_id_fk" FOREIGN KEY ("flight_id") REFERENCES "public"."flights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flight_tracks" ADD CONSTRAINT "flight_tracks_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_alignments" ADD CONSTRAINT "track_alignments_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_alignments" ADD CONSTRAINT "track_alignments_track_id_flight_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."flight_tracks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_alignments" ADD CONSTRAINT "track_alignments_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_alignments" ADD CONSTRAINT "track_alignments_set_by_users_id_fk" FOREIGN KEY ("set_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "flight_tracks_flight_uq" ON "flight_tracks" USING btree ("flight_id");--> statement-breakpoint
CREATE INDEX "flight_tracks_org_idx" ON "flight_tracks" USING btree ("organisation_id","flight_id");--> statement-breakpoint
CREATE INDEX "track_alignments_track_idx" ON "track_alignments" USING btree ("track_id","created_at");