CREATE TABLE "custody_checkpoints" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"head_seq" bigint NOT NULL,
	"head_event_id" uuid NOT NULL,
	"head_hash" text NOT NULL,
	"previous_statement_sha256" text NOT NULL,
	"signed_at" timestamp (3) with time zone NOT NULL,
	"public_key" text NOT NULL,
	"signature" text NOT NULL,
	"tsa_url" text,
	"tsa_response" text,
	"stamped_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "custody_checkpoints" ADD CONSTRAINT "custody_checkpoints_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "custody_checkpoints_org_number_uq" ON "custody_checkpoints" USING btree ("organisation_id","number");