CREATE TABLE "lab_prescription_mails" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"lab_prescription_id" uuid NOT NULL,
	"sent_to" text NOT NULL,
	"status" "reminder_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"requested_by" uuid NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "lab_prescription_mails" ADD CONSTRAINT "lab_prescription_mails_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescription_mails" ADD CONSTRAINT "lab_prescription_mails_lab_prescription_id_lab_prescriptions_id_fk" FOREIGN KEY ("lab_prescription_id") REFERENCES "public"."lab_prescriptions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescription_mails" ADD CONSTRAINT "lab_prescription_mails_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "lab_prescription_mails_prescription_idx" ON "lab_prescription_mails" USING btree ("lab_prescription_id","requested_at");--> statement-breakpoint
CREATE UNIQUE INDEX "lab_prescription_mails_one_pending" ON "lab_prescription_mails" USING btree ("lab_prescription_id") WHERE "lab_prescription_mails"."status" = 'pending';