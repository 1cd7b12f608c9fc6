CREATE TYPE "public"."audit_action" AS ENUM('read', 'create', 'amend', 'archive', 'export', 'print', 'sign-in', 'sign-in-failed', 'sign-out', 'invite', 'role-change', 'share-change', 'catalogue-change', 'policy-change');--> statement-breakpoint
CREATE TYPE "public"."audit_outcome" AS ENUM('allowed', 'refused', 'failed');--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"practice_id" uuid,
	"user_id" uuid,
	"role" "role",
	"action" "audit_action" NOT NULL,
	"outcome" "audit_outcome" NOT NULL,
	"http_status" smallint,
	"route" text,
	"record_type" text,
	"record_id" uuid,
	"patient_id" uuid,
	"query" jsonb,
	"before" jsonb,
	"after" jsonb,
	"address" text,
	"user_agent" text,
	"request_id" text
);
--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_events_practice_at_idx" ON "audit_events" USING btree ("practice_id","at");--> statement-breakpoint
CREATE INDEX "audit_events_practice_patient_at_idx" ON "audit_events" USING btree ("practice_id","patient_id","at");--> statement-breakpoint
CREATE INDEX "audit_events_practice_user_at_idx" ON "audit_events" USING btree ("practice_id","user_id","at");