// One amendment per version is the database's rule, not only the services': each amendable table
// has a unique index on supersedes_id and a foreign key supersedes_id → id (ADR 0004). A second
// amendment written straight into the table is refused, and an amendment that loses a race on
// that index reaches the client as the same 409 the service gives when it sees the amendment first.
import { and, eq, sql } from 'drizzle-orm';
import type { AnyPgColumn, PgTable } from 'drizzle-orm/pg-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../src/db/database.js';
import {
  complications,
  componentInstances,
  components,
  placements,
  recallExams,
  restorations,
  torqueEvents,
} from '../src/db/schema/index.js';
import { AMENDABLE_TABLES, supersedesUniqueName } from '../src/db/schema/amendment-chain.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import { type AccountKey, patientId, signInAll, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let tex: (suffix: string) => string;

const POSITIONS = ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const;
const healthyExam = () => ({
  sites: POSITIONS.map((position) => ({ position, probingDepthMm: 3, bleeding: false, suppuration: false })),
  mobility: false,
  plaqueIndex: 0,
  bleedingIndex: 0,
});
const wendellPlan = () => ({
  kind: 'splinted-bridge',
  retention: 'screw-to-implant',
  material: 'zirconia',
  copingsSplinted: true,
  sites: [ids.wendell15, ids.wendell16].map((s) => ({
    siteId: s,
    interface: 'non-engaging',
    impressionCoping: 'non-engaging',
    screwComponentIds: [tex('PSI')],
    impressionCopingComponentId: tex('ICN-O'),
  })),
});

type Amendable = PgTable & { id: AnyPgColumn; supersedesId: AnyPgColumn };

async function created(res: { status: number; body: { id?: string; exams?: { id: string }[] } }): Promise<string> {
  if (res.status !== 201) throw new Error(`fixture failed: ${res.status} ${JSON.stringify(res.body)}`);
  return (res.body.exams?.[0]?.id ?? res.body.id)!;
}

let examDay = 0;
/** Per table: how to get a current version, how to amend it over HTTP, and the 409 message a second amendment gets. */
const TABLES: {
  name: string;
  table: Amendable;
  version: () => Promise<string>;
  amend: (id: string) => PromiseLike<{ status: number; body: { message?: string } }>;
  message: string;
}[] = [
  {
    name: 'placements',
    table: placements,
    // The current placement of Wendell's 15 (each test below leaves a newer version there).
    version: async () =>
      (
        await ctx.db
          .select({ id: placements.id })
          .from(placements)
          .where(
            and(
              eq(placements.siteId, ids.wendell15),
              sql`not exists (select 1 from placements newer where newer.supersedes_id = ${placements.id})`,
            ),
          )
      )[0].id,
    amend: async (id) => {
      const [p] = await ctx.db.select().from(placements).where(eq(placements.id, id));
      return ctx.http.post(`/api/placements/${id}/amendments`).set('Cookie', cookies.dentist).send({
        platformId: p.platformId,
        placedOn: p.placedOn,
        lengthMm: p.lengthMm,
        amendmentReason: 'Length re-read',
      });
    },
    message: 'This placement was already amended; amend the current version',
  },
  {
    name: 'restorations',
    table: restorations,
    version: async () =>
      created(
        await ctx.http
          .post('/api/restorations')
          .set('Cookie', cookies.dentist)
          .send({ ...wendellPlan(), patientId: ids.wendell }),
      ),
    amend: (id) =>
      ctx.http
        .post(`/api/restorations/${id}/amendments`)
        .set('Cookie', cookies.dentist)
        .send({ ...wendellPlan(), amendmentReason: 'Shade at try-in' }),
    message: 'This version was already amended; amend the current version',
  },
  {
    name: 'torque_events',
    table: torqueEvents,
    version: async () =>
      created(
        await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
          componentInstanceId: ids.ferrazScrew,
          appliedNcm: 25,
          reason: 're-torque-at-recall',
          performedAt: '2025-06-06T10:00:00Z',
        }),
      ),
    amend: (id) =>
      ctx.http
        .post(`/api/torque-events/${id}/amendments`)
        .set('Cookie', cookies.dentist)
        .send({ appliedNcm: 24, performedAt: '2025-06-06T10:00:00Z', amendmentReason: 'Typed 25, read 24' }),
    message: 'This entry was already amended; amend the current version',
  },
  {
    name: 'complications',
    table: complications,
    version: async () =>
      created(
        await ctx.http
          .post('/api/complications')
          .set('Cookie', cookies.dentist)
          .send({ siteId: ids.ferraz14, kind: 'other', occurredOn: '2025-01-01' }),
      ),
    amend: (id) =>
      ctx.http
        .post(`/api/complications/${id}/amendments`)
        .set('Cookie', cookies.dentist)
        .send({ kind: 'screw-loosening', occurredOn: '2025-01-01', amendmentReason: 'Wrong kind' }),
    message: 'This entry was already amended; amend the current version',
  },
  {
    name: 'recall_exams',
    table: recallExams,
    version: async () =>
      created(
        await ctx.http
          .post('/api/recalls/visits')
          .set('Cookie', cookies.hygienist)
          .send({
            patientId: ids.ferraz,
            examinedOn: `2025-02-${String(++examDay).padStart(2, '0')}`,
            exams: [{ siteId: ids.ferraz14, ...healthyExam() }],
          }),
      ),
    amend: (id) =>
      ctx.http
        .post(`/api/recalls/exams/${id}/amend`)
        .set('Cookie', cookies.hygienist)
        .send({ ...healthyExam(), amendmentReason: 'Probe misread' }),
    message: 'This exam has already been amended; amend its latest version',
  },
];

/** Writes a copy of the version as its amendment, straight into the table (no service in between). */
async function insertCopyAsAmendment(db: Db, table: Amendable, versionId: string, supersedesId = versionId) {
  const [row] = (await db
    .select()
    .from(table as typeof placements)
    .where(eq(table.id, versionId))) as Record<string, unknown>[];
  const { id: _id, ...copy } = row;
  await db
    .insert(table as typeof placements)
    .values({ ...copy, supersedesId, amendmentReason: 'Written directly' } as typeof placements.$inferInsert);
}

/** The error PostgreSQL raised (drizzle wraps it as `cause`). */
async function refusal(write: Promise<unknown>): Promise<{ code?: string; constraint?: string }> {
  const error = await write.then(
    () => null,
    (e: unknown) => e as { cause?: { code?: string; constraint?: string } },
  );
  if (!error) throw new Error('the database accepted the write');
  return error.cause ?? (error as { code?: string; constraint?: string });
}

/** Waits until another session waits on a row or transaction lock while inserting into the table. */
async function untilInsertWaits(table: string) {
  for (let i = 0; i < 100; i++) {
    const { rows } = await ctx.db.execute<{ n: number }>(
      sql`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock' and query ilike ${`insert into "${table}"%`}`,
    );
    if (rows[0].n > 0) return true;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  return false;
}

const amendmentsOf = async (table: Amendable, id: string) =>
  (
    await ctx.db
      .select({ id: table.id })
      .from(table as typeof placements)
      .where(eq(table.supersedesId, id))
  ).length;

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  tex = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
  ids.wendell = await patientId(ctx.db, 'LL-1005');
  ids.wendell15 = await siteId(ctx.db, 'LL-1005', 15);
  ids.wendell16 = await siteId(ctx.db, 'LL-1005', 16);
  ids.ferraz = await patientId(ctx.db, 'LL-1004');
  ids.ferraz14 = await siteId(ctx.db, 'LL-1004', 14);
  const [screw] = await ctx.db
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(
      and(
        eq(componentInstances.siteId, ids.ferraz14),
        sql`${componentInstances.removedOn} is null`,
        eq(components.kind, 'abutment-screw'),
      ),
    );
  ids.ferrazScrew = screw.id;
});
afterAll(() => ctx.close());

describe.each(TABLES)(
  '$name: one amendment per version, kept by the database',
  ({ name, table, version, amend, message }) => {
    it('refuses a second amendment of one version written straight into the table (unique index on supersedes_id)', async () => {
      const id = await version();
      await insertCopyAsAmendment(ctx.db, table, id);
      const error = await refusal(insertCopyAsAmendment(ctx.db, table, id));
      expect(error).toMatchObject({ code: '23505', constraint: `${name}_supersedes_unique` });
      expect(await amendmentsOf(table, id)).toBe(1);
    });

    it('refuses an amendment of a version that does not exist (foreign key supersedes_id → id)', async () => {
      const error = await refusal(
        insertCopyAsAmendment(ctx.db, table, await version(), '00000000-0000-4000-8000-000000000000'),
      );
      expect(error).toMatchObject({ code: '23503', constraint: `${name}_supersedes_fk` });
    });

    it('answers 409 with the usual message when an amendment loses the race on the index, and the same message afterwards', async () => {
      const id = await version();
      let reply: Promise<{ status: number; body: { message?: string } }> | undefined;
      // Another session's amendment is written but not yet committed: the request passes the
      // service's up-front check, then its insert waits on the unique index until that commit.
      await ctx.db.transaction(async (tx) => {
        await insertCopyAsAmendment(tx, table, id);
        reply = Promise.resolve(amend(id));
        expect(await untilInsertWaits(name)).toBe(true);
      });
      const raced = await reply!;
      expect(raced.status).toBe(409);
      expect(raced.body.message).toBe(message);
      expect(await amendmentsOf(table, id)).toBe(1);
      const later = await amend(id);
      expect(later.status).toBe(409);
      expect(later.body.message).toBe(message);
    });
  },
);

// The HTTP races above cover the busiest tables; this covers every table, including the next one
// someone adds: a table with a supersedes_id column must be in AMENDABLE_TABLES and carry its
// chain's unique index and foreign key in the migrated database.
describe('every table with a supersedes_id column', () => {
  it('is listed as amendable and has its unique index and foreign key in the database', async () => {
    const { rows: columns } = await ctx.db.execute<{ table_name: string }>(
      sql`select table_name from information_schema.columns
          where table_schema = 'public' and column_name = 'supersedes_id' order by table_name`,
    );
    const withColumn = columns.map((c) => c.table_name);
    expect(withColumn).toEqual([...AMENDABLE_TABLES].sort());
    const { rows: guards } = await ctx.db.execute<{ table_name: string; name: string; kind: string }>(
      sql`select cl.relname as table_name, co.conname as name, 'fk' as kind
            from pg_constraint co join pg_class cl on cl.oid = co.conrelid
           where co.contype = 'f' and co.confrelid = co.conrelid
             and co.conkey = array[(select attnum from pg_attribute where attrelid = cl.oid and attname = 'supersedes_id')]::int2[]
          union all
          select tablename, indexname, 'unique'
            from pg_indexes
           where schemaname = 'public' and indexdef like 'CREATE UNIQUE INDEX % (supersedes_id)'`,
    );
    for (const table of AMENDABLE_TABLES) {
      expect(guards, table).toContainEqual({ table_name: table, name: supersedesUniqueName(table), kind: 'unique' });
      expect(guards, table).toContainEqual({ table_name: table, name: `${table}_supersedes_fk`, kind: 'fk' });
    }
  });
});
