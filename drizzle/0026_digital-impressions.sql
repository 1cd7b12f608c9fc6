CREATE TYPE "public"."impression_method" AS ENUM('analog', 'digital');--> statement-breakpoint
CREATE TYPE "public"."scan_file_type" AS ENUM('stl', 'ply', 'obj');--> statement-breakpoint
ALTER TYPE "public"."component_kind" ADD VALUE 'scan-body';--> statement-breakpoint
CREATE TABLE "impression_scan_bodies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"impression_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"component_id" uuid NOT NULL,
	"lot" text,
	CONSTRAINT "impression_scan_bodies_site_unique" UNIQUE("impression_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "impressions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"method" "impression_method" NOT NULL,
	"taken_on" date NOT NULL,
	"note" text,
	"recorded_by" uuid NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text
);
--> statement-breakpoint
CREATE TABLE "scan_files" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"restoration_id" uuid NOT NULL,
	"impression_id" uuid NOT NULL,
	"object_key" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"file_type" "scan_file_type" NOT NULL,
	"original_name" text,
	"uploaded_by" uuid NOT NULL,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "scan_files_object_key_unique" UNIQUE("object_key"),
	CONSTRAINT "scan_files_restoration_sha256_unique" UNIQUE("restoration_id","sha256")
);
--> statement-breakpoint
ALTER TABLE "impression_scan_bodies" ADD CONSTRAINT "impression_scan_bodies_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impression_scan_bodies" ADD CONSTRAINT "impression_scan_bodies_impression_id_impressions_id_fk" FOREIGN KEY ("impression_id") REFERENCES "public"."impressions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impression_scan_bodies" ADD CONSTRAINT "impression_scan_bodies_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impression_scan_bodies" ADD CONSTRAINT "impression_scan_bodies_component_id_components_id_fk" FOREIGN KEY ("component_id") REFERENCES "public"."components"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impressions" ADD CONSTRAINT "impressions_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impressions" ADD CONSTRAINT "impressions_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impressions" ADD CONSTRAINT "impressions_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impressions" ADD CONSTRAINT "impressions_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impressions" ADD CONSTRAINT "impressions_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."impressions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_files" ADD CONSTRAINT "scan_files_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_files" ADD CONSTRAINT "scan_files_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_files" ADD CONSTRAINT "scan_files_restoration_id_restorations_id_fk" FOREIGN KEY ("restoration_id") REFERENCES "public"."restorations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_files" ADD CONSTRAINT "scan_files_impression_id_impressions_id_fk" FOREIGN KEY ("impression_id") REFERENCES "public"."impressions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_files" ADD CONSTRAINT "scan_files_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "impression_scan_bodies_component_idx" ON "impression_scan_bodies" USING btree ("component_id");--> statement-breakpoint
CREATE INDEX "impression_scan_bodies_practice_lot_idx" ON "impression_scan_bodies" USING btree ("practice_id","lot") WHERE "impression_scan_bodies"."lot" is not null;--> statement-breakpoint
CREATE INDEX "impressions_restoration_idx" ON "impressions" USING btree ("restoration_id");--> statement-breakpoint
CREATE UNIQUE INDEX "impressions_first_unique" ON "impressions" USING btree ("restoration_id") WHERE "impressions"."supersedes_id" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "impressions_supersedes_unique" ON "impressions" USING btree ("supersedes_id");--> statement-breakpoint
CREATE INDEX "scan_files_restoration_idx" ON "scan_files" USING btree ("restoration_id");