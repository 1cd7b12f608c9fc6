CREATE TYPE "public"."component_kind" AS ENUM('abutment-stock', 'abutment-custom', 'abutment-angled', 'multi-unit-abutment', 'abutment-screw', 'prosthetic-screw', 'set-screw', 'impression-coping', 'healing-abutment', 'cover-screw');--> statement-breakpoint
CREATE TYPE "public"."connection" AS ENUM('internal-conical', 'internal-hex', 'external-hex');--> statement-breakpoint
CREATE TYPE "public"."impression_coping_kind" AS ENUM('engaging', 'non-engaging', 'multi-unit');--> statement-breakpoint
CREATE TYPE "public"."interface_kind" AS ENUM('engaging', 'non-engaging');--> statement-breakpoint
CREATE TYPE "public"."loading_protocol" AS ENUM('immediate', 'early', 'conventional');--> statement-breakpoint
CREATE TYPE "public"."material" AS ENUM('zirconia', 'titanium-porcelain', 'titanium-composite', 'full-gold', 'porcelain-fused-to-metal', 'other');--> statement-breakpoint
CREATE TYPE "public"."restoration_kind" AS ENUM('single-crown', 'splinted-bridge', 'full-arch');--> statement-breakpoint
CREATE TYPE "public"."restoration_status" AS ENUM('planned', 'delivered', 'removed');--> statement-breakpoint
CREATE TYPE "public"."retention" AS ENUM('screw-to-implant', 'screw-to-multi-unit', 'cement-on-abutment', 'lingual-set-screw');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('practice_admin', 'dentist', 'hygienist', 'surgeon');--> statement-breakpoint
CREATE TYPE "public"."site_status" AS ENUM('planned', 'placed', 'restored', 'failed', 'removed');--> statement-breakpoint
CREATE TYPE "public"."torque_reason" AS ENUM('initial-seating', 're-torque-after-settling', 're-torque-at-recall', 'loosening-found', 'screw-replaced');--> statement-breakpoint
CREATE TYPE "public"."torque_verdict" AS ENUM('within', 'under', 'over');--> statement-breakpoint
CREATE TYPE "public"."impression_tray" AS ENUM('open', 'closed');--> statement-breakpoint
CREATE TYPE "public"."wrench_type" AS ENUM('spring', 'friction');--> statement-breakpoint
CREATE TABLE "practices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"email" text NOT NULL,
	"display_name" text NOT NULL,
	"role" "role" NOT NULL,
	"password_hash" text NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "patient_shares" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"shared_with_user_id" uuid NOT NULL,
	"shared_by_user_id" uuid NOT NULL,
	"scope" text DEFAULT 'implant-record' NOT NULL,
	"since" timestamp with time zone DEFAULT now() NOT NULL,
	"revoked_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "patients" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"chart_number" text NOT NULL,
	"given_name" text NOT NULL,
	"family_name" text NOT NULL,
	"birth_date" date NOT NULL,
	"email" text,
	"smoker" boolean DEFAULT false NOT NULL,
	"diabetes_poorly_controlled" boolean DEFAULT false NOT NULL,
	"periodontitis_history" boolean DEFAULT false NOT NULL,
	"missing_teeth" smallint[] DEFAULT '{}' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "patients_practice_chart_unique" UNIQUE("practice_id","chart_number")
);
--> statement-breakpoint
CREATE TABLE "components" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"platform_id" uuid NOT NULL,
	"kind" "component_kind" NOT NULL,
	"name" text NOT NULL,
	"reference_code" text NOT NULL,
	"engaging" boolean,
	"angle_deg" numeric(4, 1),
	"collar_height_mm" numeric(5, 2),
	"tray" "impression_tray",
	"torque_spec_ncm" numeric(5, 1),
	"tolerance_pct" numeric(4, 1) DEFAULT 10 NOT NULL,
	"requires_lot" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "implant_systems" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"name" text NOT NULL,
	"manufacturer" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "platforms" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"system_id" uuid NOT NULL,
	"name" text NOT NULL,
	"diameter_mm" numeric(5, 2) NOT NULL,
	"connection" "connection" NOT NULL,
	"platform_shift" boolean NOT NULL
);
--> statement-breakpoint
CREATE TABLE "torque_wrenches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"label" text NOT NULL,
	"type" "wrench_type" NOT NULL,
	"last_calibrated_on" date
);
--> statement-breakpoint
CREATE TABLE "implant_sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"fdi" smallint NOT NULL,
	"status" "site_status" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "implant_sites_patient_fdi_unique" UNIQUE("patient_id","fdi")
);
--> statement-breakpoint
CREATE TABLE "placements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"platform_id" uuid NOT NULL,
	"placed_on" date NOT NULL,
	"surgeon_user_id" uuid,
	"surgeon_name" text NOT NULL,
	"length_mm" numeric(5, 2) NOT NULL,
	"lot" text,
	"udi" text,
	"insertion_torque_ncm" numeric(5, 1),
	"stability_isq" smallint,
	"grafting" text,
	"loading_protocol" "loading_protocol",
	"axis_x" numeric,
	"axis_y" numeric,
	"axis_z" numeric,
	"notes" text,
	"supersedes_id" uuid,
	"amendment_reason" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "component_instances" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"restoration_id" uuid,
	"component_id" uuid NOT NULL,
	"lot" text,
	"installed_on" date NOT NULL,
	"removed_on" date,
	"replaces_id" uuid,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "restoration_sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"interface" "interface_kind" NOT NULL,
	"impression_coping" "impression_coping_kind" NOT NULL,
	"multi_unit_angle_deg" smallint,
	"restorative_space_mm" numeric(4, 1)
);
--> statement-breakpoint
CREATE TABLE "restorations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"kind" "restoration_kind" NOT NULL,
	"retention" "retention" NOT NULL,
	"material" "material" NOT NULL,
	"shade" text,
	"status" "restoration_status" NOT NULL,
	"copings_splinted" boolean DEFAULT false NOT NULL,
	"impression_taken_on" date,
	"delivered_on" date,
	"planned_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "torque_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"component_instance_id" uuid NOT NULL,
	"applied_ncm" numeric(5, 1) NOT NULL,
	"spec_ncm" numeric(5, 1) NOT NULL,
	"tolerance_pct" numeric(4, 1) NOT NULL,
	"verdict" "torque_verdict" NOT NULL,
	"rules_version" text NOT NULL,
	"reason" "torque_reason" NOT NULL,
	"wrench_id" uuid,
	"performed_at" timestamp with time zone NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "users" ADD CONSTRAINT "users_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_shared_with_user_id_users_id_fk" FOREIGN KEY ("shared_with_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patient_shares" ADD CONSTRAINT "patient_shares_shared_by_user_id_users_id_fk" FOREIGN KEY ("shared_by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "components" ADD CONSTRAINT "components_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "components" ADD CONSTRAINT "components_platform_id_platforms_id_fk" FOREIGN KEY ("platform_id") REFERENCES "public"."platforms"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "implant_systems" ADD CONSTRAINT "implant_systems_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "platforms" ADD CONSTRAINT "platforms_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "platforms" ADD CONSTRAINT "platforms_system_id_implant_systems_id_fk" FOREIGN KEY ("system_id") REFERENCES "public"."implant_systems"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_wrenches" ADD CONSTRAINT "torque_wrenches_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "implant_sites" ADD CONSTRAINT "implant_sites_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "implant_sites" ADD CONSTRAINT "implant_sites_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_platform_id_platforms_id_fk" FOREIGN KEY ("platform_id") REFERENCES "public"."platforms"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_surgeon_user_id_users_id_fk" FOREIGN KEY ("surgeon_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_component_id_components_id_fk" FOREIGN KEY ("component_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "component_instances" ADD CONSTRAINT "component_instances_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD CONSTRAINT "restoration_sites_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD CONSTRAINT "restoration_sites_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD CONSTRAINT "restoration_sites_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restorations" ADD CONSTRAINT "restorations_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restorations" ADD CONSTRAINT "restorations_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restorations" ADD CONSTRAINT "restorations_planned_by_users_id_fk" FOREIGN KEY ("planned_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_component_instance_id_component_instances_id_fk" FOREIGN KEY ("component_instance_id") REFERENCES "public"."component_instances"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_wrench_id_torque_wrenches_id_fk" FOREIGN KEY ("wrench_id") REFERENCES "public"."torque_wrenches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "torque_events" ADD CONSTRAINT "torque_events_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "users_practice_idx" ON "users" USING btree ("practice_id");--> statement-breakpoint
CREATE INDEX "patient_shares_user_idx" ON "patient_shares" USING btree ("shared_with_user_id");--> statement-breakpoint
CREATE INDEX "patient_shares_patient_idx" ON "patient_shares" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "patients_practice_family_idx" ON "patients" USING btree ("practice_id","family_name");--> statement-breakpoint
CREATE INDEX "components_platform_idx" ON "components" USING btree ("platform_id");--> statement-breakpoint
CREATE INDEX "components_practice_idx" ON "components" USING btree ("practice_id");--> statement-breakpoint
CREATE INDEX "implant_systems_practice_idx" ON "implant_systems" USING btree ("practice_id");--> statement-breakpoint
CREATE INDEX "platforms_system_idx" ON "platforms" USING btree ("system_id");--> statement-breakpoint
CREATE INDEX "implant_sites_practice_idx" ON "implant_sites" USING btree ("practice_id");--> statement-breakpoint
CREATE INDEX "placements_site_idx" ON "placements" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "component_instances_site_idx" ON "component_instances" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "restoration_sites_site_idx" ON "restoration_sites" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "restoration_sites_restoration_idx" ON "restoration_sites" USING btree ("restoration_id");--> statement-breakpoint
CREATE INDEX "restorations_patient_idx" ON "restorations" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "torque_events_instance_idx" ON "torque_events" USING btree ("component_instance_id","performed_at");