CREATE TYPE "public"."insert_change_reason" AS ENUM('retention-loss', 'wear', 'fracture');--> statement-breakpoint
CREATE TABLE "insert_changes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"changed_on" date NOT NULL,
	"old_component_id" uuid,
	"new_component_id" uuid NOT NULL,
	"reason" "insert_change_reason" NOT NULL,
	"notes" text,
	"supersedes_id" uuid,
	"amendment_reason" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "practices" ADD COLUMN "insert_review_interval_months" integer DEFAULT 12 NOT NULL;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_old_component_id_components_id_fk" FOREIGN KEY ("old_component_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_new_component_id_components_id_fk" FOREIGN KEY ("new_component_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "insert_changes" ADD CONSTRAINT "insert_changes_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."insert_changes"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "insert_changes_site_idx" ON "insert_changes" USING btree ("site_id","changed_on");--> statement-breakpoint
CREATE INDEX "insert_changes_patient_idx" ON "insert_changes" USING btree ("patient_id");--> statement-breakpoint
CREATE UNIQUE INDEX "insert_changes_supersedes_unique" ON "insert_changes" USING btree ("supersedes_id");