CREATE TABLE "passport_mails" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"sent_to" text NOT NULL,
	"object_key" text NOT NULL,
	"status" "reminder_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"requested_by" uuid NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "practices" ADD COLUMN "phone" text;--> statement-breakpoint
ALTER TABLE "practices" ADD COLUMN "email" text;--> statement-breakpoint
ALTER TABLE "practices" ADD COLUMN "address" text;--> statement-breakpoint
ALTER TABLE "passport_mails" ADD CONSTRAINT "passport_mails_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "passport_mails" ADD CONSTRAINT "passport_mails_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "passport_mails" ADD CONSTRAINT "passport_mails_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "passport_mails_patient_idx" ON "passport_mails" USING btree ("patient_id","requested_at");--> statement-breakpoint
CREATE UNIQUE INDEX "passport_mails_one_pending" ON "passport_mails" USING btree ("patient_id") WHERE "passport_mails"."status" = 'pending';