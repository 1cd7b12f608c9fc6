CREATE TABLE "scan_body_markers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"scan_file_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"x" double precision,
	"y" double precision,
	"z" double precision,
	"placed_by" uuid NOT NULL,
	"placed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"supersedes_id" uuid,
	"amendment_reason" text,
	CONSTRAINT "scan_body_markers_point_whole" CHECK (("scan_body_markers"."x" is null) = ("scan_body_markers"."y" is null) and ("scan_body_markers"."y" is null) = ("scan_body_markers"."z" is null))
);
--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_scan_file_id_scan_files_id_fk" FOREIGN KEY ("scan_file_id") REFERENCES "public"."scan_files"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_placed_by_users_id_fk" FOREIGN KEY ("placed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scan_body_markers" ADD CONSTRAINT "scan_body_markers_supersedes_fk" FOREIGN KEY ("supersedes_id") REFERENCES "public"."scan_body_markers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "scan_body_markers_scan_file_idx" ON "scan_body_markers" USING btree ("scan_file_id");--> statement-breakpoint
CREATE UNIQUE INDEX "scan_body_markers_first_unique" ON "scan_body_markers" USING btree ("scan_file_id","site_id") WHERE "scan_body_markers"."supersedes_id" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "scan_body_markers_supersedes_unique" ON "scan_body_markers" USING btree ("supersedes_id");