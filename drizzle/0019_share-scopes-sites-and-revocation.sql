CREATE TYPE "public"."share_notice_kind" AS ENUM('shared', 'revoked');--> statement-breakpoint
CREATE TYPE "public"."share_scope" AS ENUM('placement', 'outcomes');--> statement-breakpoint
CREATE TABLE "share_notices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"share_id" uuid NOT NULL,
	"kind" "share_notice_kind" NOT NULL,
	"status" "reminder_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "scopes" "share_scope"[] DEFAULT '{placement,outcomes}'::share_scope[] NOT NULL;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "site_ids" uuid[];--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "ends_on" date;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "reason" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "revoked_by" uuid;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "revoke_reason" text;--> statement-breakpoint
ALTER TABLE "share_notices" ADD CONSTRAINT "share_notices_share_id_patient_shares_id_fk" FOREIGN KEY ("share_id") REFERENCES "public"."patient_shares"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "share_notices_one_per_kind" ON "share_notices" USING btree ("share_id","kind");--> statement-breakpoint
CREATE INDEX "share_notices_pending_idx" ON "share_notices" USING btree ("status") WHERE "share_notices"."status" = 'pending';--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_revoked_by_users_id_fk" FOREIGN KEY ("revoked_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_shares" DROP COLUMN "scope";