// The compiled row mapper must give what Drizzle's own mapResultRow gives, key for key and in the
// same order, or a reply's bytes would change (it replaces Drizzle's mapping on every hot read).
import { eq, sql } from 'drizzle-orm';
// Drizzle's own mapper: exported at run time, not in its published types.
import * as drizzleOrm from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import { date, integer, numeric, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { describe, expect, it } from 'vitest';
import { compileRowMapper, withCompiledRowMapper } from './row-mapper.js';

type Fields = Parameters<typeof compileRowMapper>[0];
const mapResultRow = (
  drizzleOrm as unknown as { mapResultRow: (f: Fields, row: unknown[], j?: Record<string, boolean>) => unknown }
).mapResultRow;

const parents = pgTable('parents', {
  id: uuid('id').primaryKey(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull(),
  takenOn: date('taken_on'),
  amount: numeric('amount'),
});
const children = pgTable('children', {
  id: uuid('id').primaryKey(),
  parentId: uuid('parent_id').notNull(),
  note: text('note'),
  rank: integer('rank'),
});
const others = pgTable('others', { id: uuid('id').primaryKey(), label: text('label') });

const db = drizzle.mock();
const query = () =>
  db
    .select({
      p: parents,
      note: children.note,
      c: children,
      o: { id: others.id, label: others.label },
      count: sql<number>`count(*)`.mapWith(Number),
      names: sql<string[]>`array[]::text[]`,
    })
    .from(parents)
    .leftJoin(children, eq(children.parentId, parents.id))
    .leftJoin(others, eq(others.id, parents.id))
    .prepare('row_mapper_spec') as unknown as { fields: Fields; joinsNotNullableMap: Record<string, boolean> };

const ROWS: unknown[][] = [
  // Every join found a row.
  ['p1', '2026-12-03 07:00:00.123+00', '2026-12-01', '12.50', 'n1', 'c1', 'p1', 'n1', 3, 'o1', 'L', '7', ['a']],
  // The children's join found nothing: `c` becomes null, as Drizzle does.
  ['p2', '2026-11-03 10:00:00+00', null, null, null, null, null, null, null, 'o2', null, '0', []],
  // Nothing joined at all.
  ['p3', '2026-10-03 10:00:00+00', '2026-10-03', '0', null, null, null, null, null, null, null, '1', null],
  // A joined row whose other columns are null is still a row.
  ['p4', '2026-09-03 10:00:00+00', null, null, null, 'c4', 'p4', null, null, 'o4', null, '2', ['b', 'c']],
];

describe('compileRowMapper', () => {
  it('maps every row as Drizzle does, keys in the same order, left joins that found nothing null', () => {
    const q = query();
    const mapped = compileRowMapper(q.fields, q.joinsNotNullableMap);
    for (const row of ROWS) {
      const expected = mapResultRow(q.fields, row, q.joinsNotNullableMap);
      const actual = mapped(row);
      expect(actual).toStrictEqual(expected);
      expect(JSON.stringify(actual)).toBe(JSON.stringify(expected));
    }
    // The cases above are the ones that matter: a null join and a kept one.
    expect(mapped(ROWS[1])).toMatchObject({ c: null, o: { id: 'o2', label: null } });
    expect(mapped(ROWS[2])).toMatchObject({ c: null, o: null, count: 1 });
    expect(mapped(ROWS[0]).p).toMatchObject({ createdAt: new Date('2026-12-03T07:00:00.123Z'), amount: '12.50' });
  });

  it('is installed on a prepared select, and leaves a query that maps its own rows alone', () => {
    const q = withCompiledRowMapper(query()) as unknown as {
      customResultMapper: (rows: unknown[][]) => unknown[];
      fields: Fields;
      joinsNotNullableMap: Record<string, boolean>;
    };
    expect(q.customResultMapper(ROWS)).toStrictEqual(
      ROWS.map((row) => mapResultRow(q.fields, row, q.joinsNotNullableMap)),
    );
    const own = (rows: unknown[][]) => rows.length;
    const custom = { fields: q.fields, customResultMapper: own };
    expect(withCompiledRowMapper(custom).customResultMapper).toBe(own);
    const raw = { customResultMapper: undefined };
    expect(withCompiledRowMapper(raw).customResultMapper).toBeUndefined();
  });
});
