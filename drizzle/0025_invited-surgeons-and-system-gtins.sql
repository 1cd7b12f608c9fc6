CREATE TABLE "system_gtins" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"system_id" uuid NOT NULL,
	"gtin" text NOT NULL,
	"entered_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "patient_shares" ALTER COLUMN "shared_with_user_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD COLUMN "invitation_id" uuid;--> statement-breakpoint
ALTER TABLE "invitations" ADD COLUMN "own_practice" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "system_gtins" ADD CONSTRAINT "system_gtins_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "system_gtins" ADD CONSTRAINT "system_gtins_system_id_implant_systems_id_fk" FOREIGN KEY ("system_id") REFERENCES "public"."implant_systems"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "system_gtins" ADD CONSTRAINT "system_gtins_entered_by_users_id_fk" FOREIGN KEY ("entered_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "system_gtins_practice_gtin_unique" ON "system_gtins" USING btree ("practice_id","gtin");--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_invitation_id_invitations_id_fk" FOREIGN KEY ("invitation_id") REFERENCES "public"."invitations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "patient_shares_invitation_idx" ON "patient_shares" USING btree ("invitation_id") WHERE "patient_shares"."invitation_id" is not null;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_has_surgeon" CHECK ("patient_shares"."shared_with_user_id" is not null or "patient_shares"."invitation_id" is not null);