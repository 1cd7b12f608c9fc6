-- Every existing part and wrench is the first (and only) version of its lineage (ADR 0006): the
-- records that point at it already point at the version they used.
UPDATE "components" SET "lineage_id" = "id" WHERE "lineage_id" IS NULL;--> statement-breakpoint
UPDATE "torque_wrenches" SET "lineage_id" = "id" WHERE "lineage_id" IS NULL;--> statement-breakpoint
-- The one calibration date each wrench kept becomes the first entry of its calibration history.
INSERT INTO "wrench_calibrations" ("practice_id", "wrench_lineage_id", "calibrated_on", "note")
SELECT "practice_id", "id", "last_calibrated_on", 'Carried over from the single calibration date kept before calibrations had a history'
FROM "torque_wrenches" WHERE "last_calibrated_on" IS NOT NULL;
