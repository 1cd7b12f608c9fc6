CREATE TYPE "public"."coping_level" AS ENUM('implant', 'multi-unit');--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "coping_level" "coping_level";