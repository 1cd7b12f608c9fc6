ALTER TYPE "public"."component_kind" ADD VALUE 'attachment-abutment';--> statement-breakpoint
ALTER TYPE "public"."component_kind" ADD VALUE 'retentive-insert';--> statement-breakpoint
ALTER TYPE "public"."component_kind" ADD VALUE 'bar-clip';--> statement-breakpoint
ALTER TYPE "public"."restoration_kind" ADD VALUE 'overdenture-studs';--> statement-breakpoint
ALTER TYPE "public"."restoration_kind" ADD VALUE 'overdenture-bar';--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "max_divergence_deg" numeric(4, 1);--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "retention_label" text;--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "retention_n" numeric(5, 1);