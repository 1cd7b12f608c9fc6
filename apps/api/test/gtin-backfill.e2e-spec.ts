// Placements recorded before placements.gtin existed kept their GTIN only inside the UDI: the
// migration runner's data step reads it with parseUdi, so the lot look-up by GTIN (and by a
// pasted UDI, which searches by GTIN) finds them too. Run here through the runner itself.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LotLookupReply } from '@torquetrail/contracts';
import { backfillPlacementGtins } from '../src/db/gtin-backfill.js';
import { runMigrations } from '../src/db/migrate.js';
import { ownerDatabaseUrl, patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookie: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookie = await signIn(ctx, 'dentist');
});
afterAll(() => ctx.close());

const byGtin = async (q: string) =>
  ((await ctx.http.get('/api/lot-lookup').query({ by: 'gtin', q }).set('Cookie', cookie)).body as LotLookupReply).rows;

describe('GTIN backfill of placements recorded before the column', () => {
  it('fills the GTIN from the stored UDI, leaves an unreadable UDI alone, and runs again to no effect', async () => {
    const harold = await patientId(ctx.db, 'LL-1001');
    // As the rows were before migration 0018: the UDI recorded, no GTIN column value. One of them
    // carries the raw (scanned) form with its GS separator, one a UDI the parser refuses.
    await ctx.db.execute(sql`update placements set gtin = null where patient_id = ${harold}`);
    const [raw] = (
      await ctx.db.execute<{ id: string }>(
        sql`select p.id from placements p join implant_sites s on s.id = p.site_id
            where p.patient_id = ${harold} and s.fdi = 37`,
      )
    ).rows;
    await ctx.db.execute(
      sql`update placements set udi = ${']d20109506012345012\u001d10SCN4310-12A07'} where id = ${raw.id}`,
    );
    const [bad] = (
      await ctx.db.execute<{ id: string }>(
        sql`select p.id from placements p join implant_sites s on s.id = p.site_id
            where p.patient_id = ${harold} and s.fdi = 36`,
      )
    ).rows;
    await ctx.db.execute(sql`update placements set udi = ${'(01)09506012345013(10)X'} where id = ${bad.id}`);
    expect(await byGtin('09506012345012')).toHaveLength(0);

    await runMigrations(ownerDatabaseUrl());

    const rows = await byGtin('09506012345012');
    expect(rows.map((r) => [r.chartNumber, r.fdi, r.gtin])).toEqual([
      ['LL-1001', 35, '09506012345012'],
      ['LL-1001', 37, '09506012345012'],
    ]);
    const left = await ctx.db.execute<{ gtin: string | null }>(sql`select gtin from placements where id = ${bad.id}`);
    expect(left.rows[0].gtin).toBeNull();
    // Nothing more to fill: the step is safe to run with every migration.
    expect(await backfillPlacementGtins(ctx.db)).toBe(0);
  });
});
