CREATE TABLE "wrench_calibrations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"wrench_lineage_id" uuid NOT NULL,
	"calibrated_on" date NOT NULL,
	"note" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "lineage_id" uuid;--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "supersedes_id" uuid;--> statement-breakpoint
ALTER TABLE "components" ADD COLUMN "created_by" uuid;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD COLUMN "lineage_id" uuid;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD COLUMN "supersedes_id" uuid;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD COLUMN "created_by" uuid;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "wrench_calibrations" ADD CONSTRAINT "wrench_calibrations_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wrench_calibrations" ADD CONSTRAINT "wrench_calibrations_wrench_lineage_id_torque_wrenches_id_fk" FOREIGN KEY ("wrench_lineage_id") REFERENCES "public"."torque_wrenches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wrench_calibrations" ADD CONSTRAINT "wrench_calibrations_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "wrench_calibrations_wrench_idx" ON "wrench_calibrations" USING btree ("wrench_lineage_id","calibrated_on");--> statement-breakpoint
ALTER TABLE "components" ADD CONSTRAINT "components_lineage_id_components_id_fk" FOREIGN KEY ("lineage_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "components" ADD CONSTRAINT "components_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "components" ADD CONSTRAINT "components_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD CONSTRAINT "torque_wrenches_lineage_id_torque_wrenches_id_fk" FOREIGN KEY ("lineage_id") REFERENCES "public"."torque_wrenches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD CONSTRAINT "torque_wrenches_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD CONSTRAINT "torque_wrenches_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."torque_wrenches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "components_lineage_idx" ON "components" USING btree ("lineage_id");--> statement-breakpoint
CREATE UNIQUE INDEX "components_supersedes_unique" ON "components" USING btree ("supersedes_id");--> statement-breakpoint
CREATE INDEX "torque_wrenches_lineage_idx" ON "torque_wrenches" USING btree ("lineage_id");--> statement-breakpoint
CREATE UNIQUE INDEX "torque_wrenches_supersedes_unique" ON "torque_wrenches" USING btree ("supersedes_id");