-- The Recall desk's sites as the CSV export's cell writes them ("fdi: status; …" in the order of the
-- summary's JSON, `not-examined` for a site never examined; '' when none), kept beside `sites` as a
-- stored generated column, so recall_summary_refresh needs no change and the export reads text
-- instead of parsing every row's JSON (issue 13, goal 4). Immutable: its result depends on its
-- argument only.
CREATE OR REPLACE FUNCTION public.desk_sites_text(sites json) RETURNS text LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT coalesce(string_agg(site.fdi || ': ' || coalesce(site.status, 'not-examined'), '; ' ORDER BY site.n), '')
  FROM ROWS FROM (json_to_recordset(sites) AS (fdi int, status text)) WITH ORDINALITY AS site (fdi, status, n)
$$;--> statement-breakpoint
ALTER TABLE "recall_summaries" ADD COLUMN "sites_text" text GENERATED ALWAYS AS (public.desk_sites_text(sites)) STORED NOT NULL;