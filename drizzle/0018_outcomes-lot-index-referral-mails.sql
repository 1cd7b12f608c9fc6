CREATE TABLE "referral_summary_mails" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"share_id" uuid NOT NULL,
	"sent_to" text NOT NULL,
	"idempotency_key" uuid NOT NULL,
	"status" "reminder_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"requested_by" uuid NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "implant_sites" ADD COLUMN "ended_on" date;--> statement-breakpoint
ALTER TABLE "placements" ADD COLUMN "gtin" text;--> statement-breakpoint
ALTER TABLE "referral_summary_mails" ADD CONSTRAINT "referral_summary_mails_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_summary_mails" ADD CONSTRAINT "referral_summary_mails_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_summary_mails" ADD CONSTRAINT "referral_summary_mails_share_id_patient_shares_id_fk" FOREIGN KEY ("share_id") REFERENCES "public"."patient_shares"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_summary_mails" ADD CONSTRAINT "referral_summary_mails_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "referral_summary_mails_idempotency_unique" ON "referral_summary_mails" USING btree ("practice_id","idempotency_key");--> statement-breakpoint
CREATE INDEX "referral_summary_mails_patient_idx" ON "referral_summary_mails" USING btree ("patient_id","requested_at");--> statement-breakpoint
CREATE UNIQUE INDEX "referral_summary_mails_one_pending" ON "referral_summary_mails" USING btree ("share_id") WHERE "referral_summary_mails"."status" = 'pending';--> statement-breakpoint
CREATE INDEX "components_practice_reference_idx" ON "components" USING btree ("practice_id","reference_code");--> statement-breakpoint
CREATE INDEX "placements_practice_lot_idx" ON "placements" USING btree ("practice_id","lot") WHERE "placements"."lot" is not null;--> statement-breakpoint
CREATE INDEX "placements_practice_gtin_idx" ON "placements" USING btree ("practice_id","gtin") WHERE "placements"."gtin" is not null;--> statement-breakpoint
CREATE INDEX "component_instances_practice_lot_idx" ON "component_instances" USING btree ("practice_id","lot") WHERE "component_instances"."lot" is not null;--> statement-breakpoint
CREATE INDEX "component_instances_component_idx" ON "component_instances" USING btree ("component_id");