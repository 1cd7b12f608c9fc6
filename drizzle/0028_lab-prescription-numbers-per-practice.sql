ALTER TABLE "lab_prescriptions" DROP CONSTRAINT "lab_prescriptions_number_unique";--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ALTER COLUMN "number" DROP IDENTITY;--> statement-breakpoint
ALTER TABLE "practices" ADD COLUMN "lab_prescription_counter" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ADD CONSTRAINT "lab_prescriptions_practice_number_unique" UNIQUE("practice_id","number");--> statement-breakpoint
-- Numbers already printed stay as they are; each practice continues from its highest.
UPDATE "practices" SET "lab_prescription_counter" = coalesce(
  (SELECT max("number") FROM "lab_prescriptions" WHERE "lab_prescriptions"."practice_id" = "practices"."id"), 0);
