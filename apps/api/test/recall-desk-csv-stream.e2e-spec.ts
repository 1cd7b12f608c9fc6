// The Recall desk's CSV leaves as a stream read through a server-side cursor (issue 13, goal 4):
// PostgreSQL hands over one batch per FETCH while the reply is being written, so an export of a
// whole practice never sits in the API's memory at once.
import { sql } from 'drizzle-orm';
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cursorBatches } from '../src/db/cursor.js';
import { PG_POOL } from '../src/db/database.js';
import { signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let pool: pg.Pool;
let hygienist: string;

beforeAll(async () => {
  ctx = await startTestApp();
  pool = ctx.app.get<pg.Pool>(PG_POOL);
  hygienist = await signIn(ctx, 'hygienist');
});
afterAll(() => ctx.close());

/** The cursor sessions that sit in an open transaction, by their last statement. */
async function idleInTransaction(): Promise<string[]> {
  const r = await ctx.db.execute<{ query: string }>(
    sql`select query from pg_stat_activity
        where datname = current_database() and state = 'idle in transaction' and query like '%batch_rows%'`,
  );
  return r.rows.map((row) => row.query);
}

describe('cursorBatches', () => {
  it('hands over the rows in batches while the cursor stays open, then gives the connection back', async () => {
    const idleBefore = pool.totalCount - pool.idleCount;
    const batches = cursorBatches<{ n: number }>(pool, sql`select g as n from generate_series(1, 1234) g`, 500);
    const first = await batches.next();
    expect(first.done).toBe(false);
    expect(first.value).toHaveLength(500);
    // Between two batches the rest is still PostgreSQL's: the session waits in its transaction.
    expect(await idleInTransaction()).toContain('fetch 500 from batch_rows');
    const sizes = [500];
    let last = 0;
    for await (const batch of batches) {
      sizes.push(batch.length);
      last = batch.at(-1)?.n ?? last;
    }
    expect(sizes).toEqual([500, 500, 234]);
    expect(last).toBe(1234);
    expect(await idleInTransaction()).toEqual([]);
    expect(pool.totalCount - pool.idleCount).toBe(idleBefore);
  });

  it('closes the cursor and frees the connection when the reader stops early', async () => {
    const inUse = pool.totalCount - pool.idleCount;
    const batches = cursorBatches<{ n: number }>(pool, sql`select g as n from generate_series(1, 5000) g`, 100);
    expect((await batches.next()).value).toHaveLength(100);
    await batches.return(undefined);
    expect(await idleInTransaction()).toEqual([]);
    expect(pool.totalCount - pool.idleCount).toBe(inUse);
  });
});

describe('GET /api/recalls/desk/csv', () => {
  it('is streamed (chunked, no length known up front) with the desk rows in the desk order', async () => {
    const csv = await ctx.http.get('/api/recalls/desk/csv').query({ sort: 'name' }).set('Cookie', hygienist);
    expect(csv.status).toBe(200);
    expect(csv.headers['transfer-encoding']).toBe('chunked');
    expect(csv.headers['content-length']).toBeUndefined();
    expect(csv.headers['content-disposition']).toBe('attachment; filename="recall-desk.csv"');
    const desk = await ctx.http
      .get('/api/recalls/desk')
      .query({ sort: 'name', pageSize: 200 })
      .set('Cookie', hygienist);
    const charts = csv.text
      .trim()
      .split('\r\n')
      .slice(1)
      .map((line) => line.split(',')[0]);
    expect(charts).toEqual(desk.body.items.map((r: { chartNumber: string }) => r.chartNumber));
    expect(charts.length).toBeGreaterThan(1);
    expect(await idleInTransaction()).toEqual([]);
  });
});
