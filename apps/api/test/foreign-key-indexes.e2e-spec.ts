// Size independence as a rule of the schema (issue 13, goal 2): a read that starts from a patient,
// a site, a restoration or any other record must find that record's rows through an index, or its
// cost grows with the practice's whole history instead of the patient's. Session 12's sweep of
// every GET route on the 10 000-patient practice (scripts/bench/size-sweep.mjs) found six such
// reads scanning whole tables (a patient's sites, parts, placements and torque events; a
// restoration's screws; a Timeline's provisional check). So every foreign key must lead an index
// usable by an equality look-up, unless it points at one of the tables below, with the reason
// (docs/adr/0010-foreign-keys-lead-an-index.md).
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from './support/test-app.js';

/**
 * Foreign keys to these tables may go without an index. Reads never start from them: a "who did
 * it" column (users) is shown with its row, a practice is the scope of every read and each table
 * is read through the patient or record it belongs to, and catalogue rows are named by the parts
 * that use them. None of them is ever deleted (people are deactivated, practices kept, catalogue
 * entries versioned: ADR 0006), so no delete has to search the referencing table either.
 */
const NOT_A_STARTING_POINT: Record<string, string> = {
  users: 'who recorded, changed or invited: shown with the row',
  practices: 'the scope of every read, always with a narrower key',
  components: 'catalogue: versioned, never deleted (ADR 0006)',
  platforms: 'catalogue: versioned, never deleted (ADR 0006)',
  implant_systems: 'catalogue: versioned, never deleted (ADR 0006)',
  torque_wrenches: 'catalogue: versioned, never deleted (ADR 0006)',
};

/**
 * Foreign keys that lead no index on purpose. The audit trail gains a row on every read of a
 * patient record, so it keeps one index per way it is read, each led by the practice.
 */
const SERVED_OTHERWISE: Record<string, string> = {
  'audit_events.patient_id': 'read by audit_events_practice_patient_at_idx (practice_id, patient_id, at)',
};

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('every foreign key', () => {
  it('leads an index an equality look-up can use, or points at a table no read starts from', async () => {
    const { rows } = await ctx.db.execute<{ key: string; referenced: string; indexed: boolean }>(sql`
      select cl.relname || '.' || (select string_agg(a.attname, ',' order by k.n)
                                     from unnest(co.conkey) with ordinality k(attnum, n)
                                     join pg_attribute a on a.attrelid = co.conrelid and a.attnum = k.attnum) as key,
             ref.relname as referenced,
             exists (
               select 1 from pg_index i
                where i.indrelid = co.conrelid
                  -- the key's columns, in its order, lead the index
                  and (i.indkey::int2[])[0:cardinality(co.conkey) - 1] = co.conkey
                  -- a partial index serves every look-up by the key only when it leaves out nulls alone
                  and (i.indpred is null
                       or pg_get_expr(i.indpred, i.indrelid) = '(' || quote_ident(
                            (select attname from pg_attribute where attrelid = co.conrelid and attnum = co.conkey[1])
                          ) || ' IS NOT NULL)')
             ) as indexed
        from pg_constraint co
        join pg_class cl on cl.oid = co.conrelid
        join pg_class ref on ref.oid = co.confrelid
       where co.contype = 'f' and cl.relnamespace = 'public'::regnamespace
       order by 1`);
    expect(rows.length).toBeGreaterThan(50);
    const unindexed = rows
      .filter((r) => !r.indexed && !(r.referenced in NOT_A_STARTING_POINT) && !(r.key in SERVED_OTHERWISE))
      .map((r) => `${r.key} → ${r.referenced}`);
    expect(unindexed).toEqual([]);
  });

  it('named as served otherwise still exists and still has that index', async () => {
    const { rows } = await ctx.db.execute<{ indexdef: string }>(
      sql`select indexdef from pg_indexes where indexname = 'audit_events_practice_patient_at_idx'`,
    );
    expect(rows[0]?.indexdef).toContain('(practice_id, patient_id, at)');
  });
});
