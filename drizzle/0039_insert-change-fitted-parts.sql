ALTER TABLE "component_instances" ADD COLUMN "insert_change_id" uuid;--> statement-breakpoint
ALTER TABLE "component_instances" ADD COLUMN "entered_in_error_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "component_instances" ADD COLUMN "entered_in_error_reason" text;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_insert_change_id_insert_changes_id_fk" FOREIGN KEY ("insert_change_id") REFERENCES "public"."insert_changes"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "component_instances_insert_change_idx" ON "component_instances" USING btree ("insert_change_id") WHERE "component_instances"."insert_change_id" is not null;--> statement-breakpoint
-- Inserts fitted before this migration: link each to the current insert change that installed it
-- (same site, part and day), so an amendment of that change can move the Stack too.
UPDATE "component_instances" ci SET "insert_change_id" = ic."id"
FROM "insert_changes" ic
WHERE ci."insert_change_id" IS NULL AND ci."site_id" = ic."site_id" AND ci."component_id" = ic."new_component_id"
  AND ci."installed_on" = ic."changed_on"
  AND NOT EXISTS (SELECT 1 FROM "insert_changes" n WHERE n."supersedes_id" = ic."id");
