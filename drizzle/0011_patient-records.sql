CREATE TYPE "public"."patient_sex" AS ENUM('not-recorded', 'female', 'male', 'other');--> statement-breakpoint
CREATE TYPE "public"."patient_version_kind" AS ENUM('created', 'edited', 'archived', 'unarchived');--> statement-breakpoint
CREATE TYPE "public"."preferred_language" AS ENUM('en', 'fr', 'de', 'es', 'it', 'nl', 'pt', 'pl', 'sv', 'tr', 'ar', 'zh');--> statement-breakpoint
ALTER TYPE "public"."reminder_status" ADD VALUE 'withheld';--> statement-breakpoint
CREATE TABLE "chart_number_sequences" (
	"practice_id" uuid PRIMARY KEY NOT NULL,
	"prefix" text NOT NULL,
	"next_number" integer NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "patient_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"kind" "patient_version_kind" NOT NULL,
	"changes" jsonb NOT NULL,
	"reason" text,
	"changed_by" uuid NOT NULL,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "patient_versions_patient_version_unique" UNIQUE("patient_id","version")
);
--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "chart_number_changed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "sex" "patient_sex" DEFAULT 'not-recorded' NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "phone" text;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "preferred_language" "preferred_language" DEFAULT 'en' NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "email_reminder_consent" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "email_reminder_consent_on" date;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "risk_factors_recorded_on" date;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "archived_by" uuid;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "archive_reason" text;--> statement-breakpoint
ALTER TABLE "chart_number_sequences" ADD CONSTRAINT "chart_number_sequences_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "chart_number_sequences" ADD CONSTRAINT "chart_number_sequences_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_versions" ADD CONSTRAINT "patient_versions_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_versions" ADD CONSTRAINT "patient_versions_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_versions" ADD CONSTRAINT "patient_versions_changed_by_users_id_fk" FOREIGN KEY ("changed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_archived_by_users_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "patients_practice_birth_idx" ON "patients" USING btree ("practice_id","birth_date");