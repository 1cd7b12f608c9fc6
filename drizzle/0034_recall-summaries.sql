CREATE TABLE "recall_summaries" (
	"patient_id" uuid PRIMARY KEY NOT NULL,
	"practice_id" uuid NOT NULL,
	"family_name" text NOT NULL,
	"given_name" text NOT NULL,
	"archived" boolean DEFAULT false NOT NULL,
	"on_desk" boolean DEFAULT false NOT NULL,
	"next_due" date,
	"last_exam_on" date,
	"prior_peri_implantitis" boolean DEFAULT false NOT NULL,
	"peri_implantitis_last" boolean DEFAULT false NOT NULL,
	"provisional_due" date,
	"sites" json DEFAULT '[]'::json NOT NULL
);
--> statement-breakpoint
ALTER TABLE "recall_summaries" ADD CONSTRAINT "recall_summaries_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "recall_summaries_name_idx" ON "recall_summaries" USING btree ("practice_id","archived","family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk";--> statement-breakpoint
CREATE INDEX "recall_summaries_due_asc_idx" ON "recall_summaries" USING btree ("practice_id","archived","next_due","family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk";--> statement-breakpoint
CREATE INDEX "recall_summaries_due_desc_idx" ON "recall_summaries" USING btree ("practice_id","archived","next_due" DESC NULLS LAST,"family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk";--> statement-breakpoint
CREATE INDEX "recall_summaries_exam_asc_idx" ON "recall_summaries" USING btree ("practice_id","archived","last_exam_on","family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk";--> statement-breakpoint
CREATE INDEX "recall_summaries_exam_desc_idx" ON "recall_summaries" USING btree ("practice_id","archived","last_exam_on" DESC NULLS LAST,"family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk";--> statement-breakpoint
CREATE INDEX "recall_summaries_pi_last_idx" ON "recall_summaries" USING btree ("practice_id","archived","family_name","given_name","patient_id") WHERE "recall_summaries"."on_desk" and "recall_summaries"."peri_implantitis_last";--> statement-breakpoint
CREATE INDEX "recall_summaries_provisional_idx" ON "recall_summaries" USING btree ("practice_id","archived","provisional_due") WHERE "recall_summaries"."on_desk" and "recall_summaries"."provisional_due" is not null;--> statement-breakpoint
-- The Recall desk's read model (ADR 0009), kept by PostgreSQL in the transaction of every write to
-- its sources, whichever code path makes it. recall_summary_refresh recomputes the rows of the
-- patients given, whole, from the sources; the triggers below call it once per statement with the
-- patients that statement touched (transition tables), so a bulk insert costs one set-based pass.
-- The rows are locked first and read after, so two transactions writing for the same patient
-- leave the summary of both writes (the second waits, then reads what the first committed).
-- A new desk filter: a column in recall_summaries (schema/recalls.ts), its expression here, and,
-- when its source is a new table, a trigger on that table (recall_summary_touch, naming the
-- table's patient column).
CREATE OR REPLACE FUNCTION public.recall_summary_refresh(ids uuid[]) RETURNS void LANGUAGE plpgsql AS $$
BEGIN
  IF ids IS NULL OR cardinality(ids) = 0 THEN
    RETURN;
  END IF;
  INSERT INTO public.recall_summaries (patient_id, practice_id, family_name, given_name)
    SELECT pa.id, pa.practice_id, pa.family_name, pa.given_name FROM public.patients pa WHERE pa.id = ANY (ids)
    ON CONFLICT (patient_id) DO NOTHING;
  PERFORM 1 FROM public.recall_summaries rs WHERE rs.patient_id = ANY (ids) ORDER BY rs.patient_id FOR UPDATE;
  WITH exams AS (
    -- Current exams: not replaced by an amendment.
    SELECT x.patient_id, x.site_id, x.status, x.examined_on, x.recorded_at
    FROM public.recall_exams x
    WHERE x.patient_id = ANY (ids)
      AND NOT EXISTS (SELECT 1 FROM public.recall_exams n WHERE n.supersedes_id = x.id)
  ), by_patient AS (
    SELECT e.patient_id, max(e.examined_on) AS last_exam_on, bool_or(e.status = 'peri-implantitis') AS prior_pi
    FROM exams e GROUP BY e.patient_id
  ), site_latest AS (
    SELECT DISTINCT ON (e.site_id) e.site_id, e.status, e.examined_on
    FROM exams e ORDER BY e.site_id, e.examined_on DESC, e.recorded_at DESC
  ), desk_sites AS (
    SELECT s.patient_id,
           json_agg(json_build_object('siteId', s.id, 'fdi', s.fdi, 'status', l.status, 'examinedOn', l.examined_on)
                    ORDER BY s.fdi) AS sites,
           coalesce(bool_or(l.status = 'peri-implantitis'), false) AS pi_last
    FROM public.implant_sites s LEFT JOIN site_latest l ON l.site_id = s.id
    WHERE s.patient_id = ANY (ids) AND s.status IN ('placed', 'restored')
    GROUP BY s.patient_id
  ), due AS (
    SELECT r.patient_id, min(r.due_on) AS next_due
    FROM public.recalls r WHERE r.patient_id = ANY (ids) AND r.status = 'scheduled' GROUP BY r.patient_id
  ), provisional AS (
    SELECT rp.patient_id, min(rp.planned_replacement_on) AS provisional_due
    FROM public.restorations rp WHERE rp.patient_id = ANY (ids) AND rp.provisional AND rp.status = 'delivered'
    GROUP BY rp.patient_id
  )
  UPDATE public.recall_summaries rs SET
    practice_id = pa.practice_id,
    family_name = pa.family_name,
    given_name = pa.given_name,
    archived = pa.archived_at IS NOT NULL,
    on_desk = ds.patient_id IS NOT NULL,
    next_due = d.next_due,
    last_exam_on = bp.last_exam_on,
    prior_peri_implantitis = coalesce(bp.prior_pi, false),
    peri_implantitis_last = coalesce(ds.pi_last, false),
    provisional_due = pv.provisional_due,
    sites = coalesce(ds.sites, '[]'::json)
  FROM public.patients pa
    LEFT JOIN by_patient bp ON bp.patient_id = pa.id
    LEFT JOIN desk_sites ds ON ds.patient_id = pa.id
    LEFT JOIN due d ON d.patient_id = pa.id
    LEFT JOIN provisional pv ON pv.patient_id = pa.id
  WHERE pa.id = ANY (ids) AND rs.patient_id = pa.id;
END
$$;--> statement-breakpoint
-- A statement trigger's function: the patients of the rows the statement inserted, updated or
-- deleted (TG_ARGV[0]: the table's patient column), refreshed in one call.
CREATE OR REPLACE FUNCTION public.recall_summary_touch() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  ids uuid[];
BEGIN
  IF TG_OP = 'INSERT' THEN
    EXECUTE format('SELECT array_agg(DISTINCT %I) FROM new_rows', TG_ARGV[0]) INTO ids;
  ELSIF TG_OP = 'DELETE' THEN
    EXECUTE format('SELECT array_agg(DISTINCT %I) FROM old_rows', TG_ARGV[0]) INTO ids;
  ELSE
    EXECUTE format('SELECT array_agg(DISTINCT p) FROM (SELECT %1$I AS p FROM new_rows UNION SELECT %1$I FROM old_rows) u',
                   TG_ARGV[0]) INTO ids;
  END IF;
  PERFORM public.recall_summary_refresh(ids);
  RETURN NULL;
END
$$;--> statement-breakpoint
DO $$
DECLARE
  source record;
BEGIN
  FOR source IN SELECT * FROM (VALUES ('patients', 'id'), ('implant_sites', 'patient_id'), ('recall_exams', 'patient_id'),
                                      ('recalls', 'patient_id'), ('restorations', 'patient_id')) AS s (tbl, col) LOOP
    EXECUTE format('CREATE TRIGGER %I AFTER INSERT ON public.%I REFERENCING NEW TABLE AS new_rows
                    FOR EACH STATEMENT EXECUTE FUNCTION public.recall_summary_touch(%L)',
                   source.tbl || '_recall_summary_insert', source.tbl, source.col);
    EXECUTE format('CREATE TRIGGER %I AFTER UPDATE ON public.%I REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
                    FOR EACH STATEMENT EXECUTE FUNCTION public.recall_summary_touch(%L)',
                   source.tbl || '_recall_summary_update', source.tbl, source.col);
    EXECUTE format('CREATE TRIGGER %I AFTER DELETE ON public.%I REFERENCING OLD TABLE AS old_rows
                    FOR EACH STATEMENT EXECUTE FUNCTION public.recall_summary_touch(%L)',
                   source.tbl || '_recall_summary_delete', source.tbl, source.col);
  END LOOP;
END
$$;--> statement-breakpoint
-- Every patient of the database, once.
SELECT public.recall_summary_refresh(array(SELECT id FROM public.patients));
