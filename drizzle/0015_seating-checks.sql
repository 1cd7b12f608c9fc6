CREATE TYPE "public"."seating_answer" AS ENUM('yes', 'no', 'unsure');--> statement-breakpoint
CREATE TYPE "public"."seating_event" AS ENUM('impression', 'delivery');--> statement-breakpoint
CREATE TABLE "seating_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"event" "seating_event" NOT NULL,
	"radiograph_id" uuid NOT NULL,
	"seated" "seating_answer" NOT NULL,
	"note" text,
	"recorded_by" uuid NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text
);
--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_radiograph_id_radiographs_id_fk" FOREIGN KEY ("radiograph_id") REFERENCES "public"."radiographs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "seating_checks" ADD CONSTRAINT "seating_checks_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."seating_checks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "seating_checks_restoration_idx" ON "seating_checks" USING btree ("restoration_id");--> statement-breakpoint
CREATE UNIQUE INDEX "seating_checks_first_unique" ON "seating_checks" USING btree ("restoration_id","event") WHERE "seating_checks"."supersedes_id" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "seating_checks_supersedes_unique" ON "seating_checks" USING btree ("supersedes_id");