CREATE TYPE "public"."radiograph_file_type" AS ENUM('png', 'jpeg', 'dicom');--> statement-breakpoint
CREATE TYPE "public"."radiograph_kind" AS ENUM('periapical', 'bitewing', 'panoramic', 'cbct-export', 'other');--> statement-breakpoint
CREATE TABLE "radiograph_measurements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"radiograph_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"points" jsonb NOT NULL,
	"implant_true_mm" double precision NOT NULL,
	"mm_per_unit" double precision NOT NULL,
	"mesial_mm" double precision NOT NULL,
	"distal_mm" double precision NOT NULL,
	"spacing_estimate" jsonb,
	"rules_version" text NOT NULL,
	"measured_by" uuid NOT NULL,
	"measured_at" timestamp with time zone DEFAULT now() NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text
);
--> statement-breakpoint
CREATE TABLE "radiograph_sites" (
	"radiograph_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	CONSTRAINT "radiograph_sites_radiograph_id_site_id_pk" PRIMARY KEY("radiograph_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "radiographs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"object_key" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"file_type" "radiograph_file_type" NOT NULL,
	"original_name" text,
	"kind" "radiograph_kind" NOT NULL,
	"taken_on" date,
	"note" text,
	"rows" integer,
	"columns" integer,
	"pixel_spacing" jsonb,
	"imager_pixel_spacing" jsonb,
	"magnification_factor" double precision,
	"study_date" date,
	"modality" text,
	"bits_stored" integer,
	"photometric_interpretation" text,
	"transfer_syntax_uid" text,
	"preview_problem" text,
	"uploaded_by" uuid NOT NULL,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"entered_in_error_at" timestamp with time zone,
	"entered_in_error_by" uuid,
	"entered_in_error_reason" text,
	CONSTRAINT "radiographs_object_key_unique" UNIQUE("object_key"),
	CONSTRAINT "radiographs_patient_sha256_unique" UNIQUE("patient_id","sha256")
);
--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_radiograph_id_radiographs_id_fk" FOREIGN KEY ("radiograph_id") REFERENCES "public"."radiographs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_measured_by_users_id_fk" FOREIGN KEY ("measured_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_measurements" ADD CONSTRAINT "radiograph_measurements_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."radiograph_measurements"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_sites" ADD CONSTRAINT "radiograph_sites_radiograph_id_radiographs_id_fk" FOREIGN KEY ("radiograph_id") REFERENCES "public"."radiographs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiograph_sites" ADD CONSTRAINT "radiograph_sites_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiographs" ADD CONSTRAINT "radiographs_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiographs" ADD CONSTRAINT "radiographs_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiographs" ADD CONSTRAINT "radiographs_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "radiographs" ADD CONSTRAINT "radiographs_entered_in_error_by_users_id_fk" FOREIGN KEY ("entered_in_error_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "radiograph_measurements_site_idx" ON "radiograph_measurements" USING btree ("site_id","measured_at");--> statement-breakpoint
CREATE UNIQUE INDEX "radiograph_measurements_supersedes_unique" ON "radiograph_measurements" USING btree ("supersedes_id");--> statement-breakpoint
CREATE INDEX "radiograph_sites_site_idx" ON "radiograph_sites" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "radiographs_patient_idx" ON "radiographs" USING btree ("patient_id","taken_on");--> statement-breakpoint
CREATE INDEX "radiographs_uploader_day_idx" ON "radiographs" USING btree ("uploaded_by","uploaded_at");