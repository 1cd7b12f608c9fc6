// The Recall desk's CSV leaves as a stream read through a server-side cursor (issue 13, goal 4):
// PostgreSQL hands over one batch per FETCH while the reply is being written, so an export of a
// whole practice never sits in the API's memory at once.
import { parse } from 'csv-parse/sync';
import { sql } from 'drizzle-orm';
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
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

/**
 * The cursor sessions inside an open transaction, by their last statement: waiting for the reader,
 * or reading the next batch ahead of it (cursorBatches sends the next FETCH before handing a batch over).
 */
async function idleInTransaction(): Promise<string[]> {
  const r = await ctx.db.execute<{ query: string }>(
    sql`select query from pg_stat_activity
        where datname = current_database() and pid <> pg_backend_pid()
          and state in ('idle in transaction', 'active') and query like '%batch_rows%'`,
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
    // Between two batches the rest is still PostgreSQL's: the session is in its transaction, the
    // next batch already asked for.
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

  it('asks for the next batch before handing one over, so PostgreSQL reads while the reader writes', async () => {
    // The statements sent on the cursor's connection (the spy calls through).
    let calls: unknown[][] = [];
    const spy = (client: pg.PoolClient) => {
      calls = vi.spyOn(client, 'query').mock.calls;
    };
    const fetches = () =>
      calls.map(([text]) => text).filter((text) => typeof text === 'string' && text.startsWith('fetch'));
    pool.once('acquire', spy);
    const batches = cursorBatches<{ n: number }>(pool, sql`select g as n from generate_series(1, 250) g`, 100);
    try {
      expect((await batches.next()).value).toHaveLength(100);
      // The first batch is in the reader's hands and the second already asked for; not the third.
      expect(fetches()).toEqual(['fetch 100 from batch_rows', 'fetch 100 from batch_rows']);
      const rest: number[] = [];
      for await (const batch of batches) rest.push(batch.length);
      expect(rest).toEqual([100, 50]);
      // A short batch is the last: no FETCH after it.
      expect(fetches()).toHaveLength(3);
    } finally {
      await batches.return(undefined);
      pool.off('acquire', spy);
      vi.restoreAllMocks();
    }
    expect(await idleInTransaction()).toEqual([]);
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

  // The export's statement joins an own practice's sites into the cell's text in PostgreSQL; a
  // shared patient's come as JSON, filtered by the share, and are joined by the API. Either way
  // the cells are what the desk on screen shows.
  it.each(['hygienist', 'surgeon'] as const)('writes each row as the desk shows it, for the %s', async (who) => {
    const cookie = who === 'hygienist' ? hygienist : await signIn(ctx, who);
    const csv = await ctx.http.get('/api/recalls/desk/csv').query({ sort: 'name' }).set('Cookie', cookie);
    const desk = await ctx.http.get('/api/recalls/desk').query({ sort: 'name', pageSize: 200 }).set('Cookie', cookie);
    expect(csv.status).toBe(200);
    const [header = [], ...rows] = parse(csv.text);
    const cells = ['chart number', 'next recall', 'overdue days', 'last exam', 'last status per implant'].map((name) =>
      header.indexOf(name),
    );
    type Item = {
      chartNumber: string;
      nextDueOn: string | null;
      overdueDays: number;
      lastExamOn: string | null;
      sites: { fdi: number; status: string }[];
    };
    const items = desk.body.items as Item[];
    expect(rows.map((row) => cells.map((i) => row[i]))).toEqual(
      items.map((item) => [
        item.chartNumber,
        item.nextDueOn ?? '',
        String(item.overdueDays),
        item.lastExamOn ?? '',
        item.sites.map((s) => `${s.fdi}: ${s.status}`).join('; '),
      ]),
    );
    // Rows with several sites, and with a site never examined, are among them.
    expect(items.some((item) => item.sites.length > 1)).toBe(true);
    expect(items.some((item) => item.sites.some((s) => s.status === 'not-examined'))).toBe(true);
  });
});
