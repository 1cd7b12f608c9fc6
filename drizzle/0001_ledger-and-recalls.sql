CREATE TYPE "public"."complication_kind" AS ENUM('screw-loosening', 'screw-fracture', 'abutment-fracture', 'veneer-chipping', 'framework-fracture', 'other');--> statement-breakpoint
CREATE TYPE "public"."peri_implant_status" AS ENUM('health', 'mucositis', 'peri-implantitis');--> statement-breakpoint
CREATE TYPE "public"."probing_site" AS ENUM('mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual');--> statement-breakpoint
CREATE TYPE "public"."recall_status" AS ENUM('scheduled', 'done', 'cancelled');--> statement-breakpoint
CREATE TYPE "public"."reminder_kind" AS ENUM('upcoming', 'overdue');--> statement-breakpoint
CREATE TYPE "public"."reminder_status" AS ENUM('pending', 'sent', 'failed');--> statement-breakpoint
CREATE TABLE "complications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"component_instance_id" uuid,
	"kind" "complication_kind" NOT NULL,
	"occurred_on" date NOT NULL,
	"notes" text,
	"supersedes_id" uuid,
	"amendment_reason" text,
	"recorded_by" uuid,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "finding_acknowledgements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"code" text NOT NULL,
	"fdi" smallint,
	"acknowledged_by" uuid NOT NULL,
	"acknowledged_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lab_prescriptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"object_key" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"emailed_to" text,
	"emailed_at" timestamp with time zone,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lab_prescriptions_object_key_unique" UNIQUE("object_key")
);
--> statement-breakpoint
CREATE TABLE "restoration_site_components" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"restoration_site_id" uuid NOT NULL,
	"component_id" uuid NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recall_exam_sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"exam_id" uuid NOT NULL,
	"position" "probing_site" NOT NULL,
	"probing_depth_mm" numeric(3, 1) NOT NULL,
	"bleeding" boolean NOT NULL,
	"suppuration" boolean NOT NULL,
	CONSTRAINT "recall_exam_sites_exam_position_unique" UNIQUE("exam_id","position")
);
--> statement-breakpoint
CREATE TABLE "recall_exams" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"visit_id" uuid NOT NULL,
	"examined_on" date NOT NULL,
	"examiner_id" uuid NOT NULL,
	"mobility" boolean NOT NULL,
	"plaque_index" smallint,
	"bleeding_index" smallint,
	"keratinized_mucosa_mm" numeric(3, 1),
	"residual_cement" boolean DEFAULT false NOT NULL,
	"bone_level_mm" numeric(4, 1),
	"is_baseline" boolean DEFAULT false NOT NULL,
	"notes" text,
	"status" "peri_implant_status" NOT NULL,
	"reasons" jsonb NOT NULL,
	"flags" jsonb NOT NULL,
	"rules_version" text NOT NULL,
	"rule_options" jsonb NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recall_policies" (
	"practice_id" uuid PRIMARY KEY NOT NULL,
	"base_months" smallint DEFAULT 6 NOT NULL,
	"risk_months" smallint DEFAULT 3 NOT NULL,
	"reminder_days_before" smallint DEFAULT 14 NOT NULL,
	"overdue_reminder_days_after" smallint DEFAULT 7 NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recalls" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"due_on" date NOT NULL,
	"status" "recall_status" DEFAULT 'scheduled' NOT NULL,
	"scheduled_from_visit_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reminder_log" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"recall_due_on" date NOT NULL,
	"kind" "reminder_kind" NOT NULL,
	"idempotency_key" text NOT NULL,
	"status" "reminder_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reminder_log_idempotency_unique" UNIQUE("idempotency_key")
);
--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD COLUMN "axis_x" numeric;--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD COLUMN "axis_y" numeric;--> statement-breakpoint
ALTER TABLE "restoration_sites" ADD COLUMN "axis_z" numeric;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "findings" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "rules_version" text;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "lab_name" text;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "lab_email" text;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "due_on" date;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "notes" text;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "supersedes_id" uuid;--> statement-breakpoint
ALTER TABLE "restorations" ADD COLUMN "amendment_reason" text;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_component_instance_id_component_instances_id_fk" FOREIGN KEY ("component_instance_id") REFERENCES "public"."component_instances"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_acknowledgements" ADD CONSTRAINT "finding_acknowledgements_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_acknowledgements" ADD CONSTRAINT "finding_acknowledgements_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_acknowledgements" ADD CONSTRAINT "finding_acknowledgements_acknowledged_by_users_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ADD CONSTRAINT "lab_prescriptions_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ADD CONSTRAINT "lab_prescriptions_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ADD CONSTRAINT "lab_prescriptions_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_prescriptions" ADD CONSTRAINT "lab_prescriptions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_site_components" ADD CONSTRAINT "restoration_site_components_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_site_components" ADD CONSTRAINT "restoration_site_components_restoration_site_id_restoration_sites_id_fk" FOREIGN KEY ("restoration_site_id") REFERENCES "public"."restoration_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "restoration_site_components" ADD CONSTRAINT "restoration_site_components_component_id_components_id_fk" FOREIGN KEY ("component_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exam_sites" ADD CONSTRAINT "recall_exam_sites_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exam_sites" ADD CONSTRAINT "recall_exam_sites_exam_id_recall_exams_id_fk" FOREIGN KEY ("exam_id") REFERENCES "public"."recall_exams"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exams" ADD CONSTRAINT "recall_exams_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exams" ADD CONSTRAINT "recall_exams_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exams" ADD CONSTRAINT "recall_exams_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_exams" ADD CONSTRAINT "recall_exams_examiner_id_users_id_fk" FOREIGN KEY ("examiner_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_policies" ADD CONSTRAINT "recall_policies_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recall_policies" ADD CONSTRAINT "recall_policies_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recalls" ADD CONSTRAINT "recalls_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recalls" ADD CONSTRAINT "recalls_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_log" ADD CONSTRAINT "reminder_log_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "complications_site_idx" ON "complications" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "finding_acknowledgements_restoration_idx" ON "finding_acknowledgements" USING btree ("restoration_id");--> statement-breakpoint
CREATE INDEX "lab_prescriptions_restoration_idx" ON "lab_prescriptions" USING btree ("restoration_id");--> statement-breakpoint
CREATE INDEX "restoration_site_components_site_idx" ON "restoration_site_components" USING btree ("restoration_site_id");--> statement-breakpoint
CREATE INDEX "recall_exams_site_idx" ON "recall_exams" USING btree ("site_id","examined_on");--> statement-breakpoint
CREATE INDEX "recall_exams_patient_idx" ON "recall_exams" USING btree ("patient_id","examined_on");--> statement-breakpoint
CREATE INDEX "recalls_practice_due_idx" ON "recalls" USING btree ("practice_id","status","due_on");--> statement-breakpoint
CREATE INDEX "recalls_patient_idx" ON "recalls" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "reminder_log_practice_idx" ON "reminder_log" USING btree ("practice_id","created_at");