CREATE TABLE "import_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"import_id" uuid NOT NULL,
	"row_number" integer NOT NULL,
	"record_table" text NOT NULL,
	"record_id" uuid NOT NULL,
	CONSTRAINT "import_entries_row_unique" UNIQUE("import_id","row_number","record_table")
);
--> statement-breakpoint
CREATE TABLE "imported_free_text_parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"part_ref" text NOT NULL,
	"part_name" text,
	"lot" text,
	"installed_on" date NOT NULL
);
--> statement-breakpoint
CREATE TABLE "legacy_imports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"practice_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"file_name" text NOT NULL,
	"row_count" integer NOT NULL,
	"counts" jsonb NOT NULL,
	"rules_version" text NOT NULL,
	"imported_by" uuid NOT NULL,
	"imported_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "legacy_imports_practice_sha256_unique" UNIQUE("practice_id","sha256")
);
--> statement-breakpoint
ALTER TABLE "import_entries" ADD CONSTRAINT "import_entries_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_entries" ADD CONSTRAINT "import_entries_import_id_legacy_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."legacy_imports"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imported_free_text_parts" ADD CONSTRAINT "imported_free_text_parts_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imported_free_text_parts" ADD CONSTRAINT "imported_free_text_parts_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imported_free_text_parts" ADD CONSTRAINT "imported_free_text_parts_site_id_implant_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."implant_sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "legacy_imports" ADD CONSTRAINT "legacy_imports_practice_id_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."practices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "legacy_imports" ADD CONSTRAINT "legacy_imports_imported_by_users_id_fk" FOREIGN KEY ("imported_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "import_entries_record_idx" ON "import_entries" USING btree ("record_id");--> statement-breakpoint
CREATE INDEX "imported_free_text_parts_site_idx" ON "imported_free_text_parts" USING btree ("site_id");