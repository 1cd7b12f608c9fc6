-- The API connects as torquetrail_app, not as the owner that runs these migrations (issue 11):
-- it may read and write the product's tables but only INSERT and SELECT the audit trail, so no
-- bug or injected statement in the app can rewrite or erase who did what. The owner keeps every
-- right and stays out of the app's environment. The role is cluster-wide and created once; its
-- LOGIN and password are set by whoever deploys (docs/deployment.md; scripts/lib/postgres.mjs
-- does it for the local cluster). Creating it needs CREATEROLE (or a superuser) once.
DO $$
BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'torquetrail_app') THEN
    CREATE ROLE torquetrail_app NOLOGIN;
  END IF;
END
$$;--> statement-breakpoint
-- The grants live in one function so that a restore (pg_restore --no-acl) can apply them again.
CREATE OR REPLACE FUNCTION public.torquetrail_grant_app_role() RETURNS void LANGUAGE plpgsql AS $$
DECLARE
  r record;
BEGIN
  -- CREATE: pg-boss makes and migrates its own schema (pgboss) at its first start, as the app.
  EXECUTE format('GRANT CONNECT, TEMPORARY, CREATE ON DATABASE %I TO torquetrail_app', current_database());
  GRANT USAGE ON SCHEMA public TO torquetrail_app;
  GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO torquetrail_app;
  GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO torquetrail_app;
  -- Tables that later migrations add get the same rights without a grant of their own.
  ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO torquetrail_app;
  ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO torquetrail_app;
  -- Append-only: the audit trail is read and added to, never changed.
  REVOKE UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON public.audit_events FROM torquetrail_app;
  -- A queue made before this migration belongs to the owner; pg-boss must own it to add its
  -- per-queue partitions, so it passes to the app with its tables, functions and types.
  IF EXISTS (SELECT 1 FROM pg_namespace WHERE nspname = 'pgboss') THEN
    EXECUTE 'ALTER SCHEMA pgboss OWNER TO torquetrail_app';
    FOR r IN SELECT c.relname FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
             WHERE n.nspname = 'pgboss' AND c.relkind IN ('r', 'p', 'v') LOOP
      EXECUTE format('ALTER TABLE pgboss.%I OWNER TO torquetrail_app', r.relname);
    END LOOP;
    FOR r IN SELECT p.oid::regprocedure AS fn FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
             WHERE n.nspname = 'pgboss' LOOP
      EXECUTE format('ALTER FUNCTION %s OWNER TO torquetrail_app', r.fn);
    END LOOP;
    FOR r IN SELECT t.typname FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
             WHERE n.nspname = 'pgboss' AND t.typtype IN ('e', 'd') LOOP
      EXECUTE format('ALTER TYPE pgboss.%I OWNER TO torquetrail_app', r.typname);
    END LOOP;
  END IF;
END
$$;--> statement-breakpoint
REVOKE ALL ON FUNCTION public.torquetrail_grant_app_role() FROM PUBLIC;--> statement-breakpoint
SELECT public.torquetrail_grant_app_role();
