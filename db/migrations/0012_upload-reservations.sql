CREATE TABLE "upload_reservations" (
	"upload_id" text PRIMARY KEY NOT NULL,
	"organisation_id" uuid NOT NULL,
	"bytes" bigint NOT NULL,
	"original_key" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"placing_since" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "upload_reservations" ADD CONSTRAINT "upload_reservations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "upload_reservations_org_idx" ON "upload_reservations" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "upload_reservations_placing_idx" ON "upload_reservations" USING btree ("placing_since");