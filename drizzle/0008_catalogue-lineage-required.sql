ALTER TABLE "components" ALTER COLUMN "lineage_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ALTER COLUMN "lineage_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "torque_wrenches" DROP COLUMN "last_calibrated_on";