ALTER TABLE "practices" ADD COLUMN "wrench_calibration_interval_months" integer DEFAULT 12 NOT NULL;--> statement-breakpoint
ALTER TABLE "torque_events" ADD COLUMN "wrench_calibration_overdue" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "torque_events" ADD COLUMN "early_settling_confirmed" boolean DEFAULT false NOT NULL;