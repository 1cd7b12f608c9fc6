CREATE TYPE "public"."radiograph_preview_status" AS ENUM('pending', 'ready', 'unavailable');--> statement-breakpoint
ALTER TABLE "radiographs" ADD COLUMN "preview_status" "radiograph_preview_status" DEFAULT 'pending' NOT NULL;--> statement-breakpoint
ALTER TABLE "radiographs" ADD COLUMN "preview_attempts" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX "radiographs_preview_pending_idx" ON "radiographs" USING btree ("uploaded_at") WHERE "radiographs"."preview_status" = 'pending';