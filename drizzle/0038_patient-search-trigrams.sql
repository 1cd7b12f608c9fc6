-- Trigram indexes for the searches by any part of a name or chart number (ilike '%word%': the
-- patient list and the Recall desk). pg_trgm ships with PostgreSQL (Debian's postgresql-15 package)
-- and is a trusted extension since PostgreSQL 13: the database's owner, which runs the migrations,
-- creates it without being a superuser. IF NOT EXISTS: a database where an administrator already
-- created it (or a restore) is left as it is.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE INDEX "patients_given_name_trgm_idx" ON "patients" USING gin ("given_name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "patients_family_name_trgm_idx" ON "patients" USING gin ("family_name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "patients_chart_number_trgm_idx" ON "patients" USING gin ("chart_number" gin_trgm_ops);