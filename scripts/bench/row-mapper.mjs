// Drizzle's mapResultRow against the compiled row mapper (apps/api/dist/db/row-mapper.js) on the
// same rows, in one process, alternated 5 times: the per-row cost of mapping a select with two
// left joins, a timestamp, a date, a numeric and SQL fields (the shape of the Site file's reads).
// Prints ns per row and the ratio; measures only (bench/results/s10-api/README.md). After a build.
import { createRequire } from 'node:module';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { repoRoot } from '../lib/config.mjs';

// Drizzle as the API resolves it (a dependency of apps/api, not of the repository's scripts).
const fromApi = createRequire(path.join(repoRoot, 'apps/api/package.json'));
const load = (name) => import(pathToFileURL(fromApi.resolve(name)).href);
const drizzleOrm = await load('drizzle-orm');
const { drizzle } = await load('drizzle-orm/node-postgres');
const { date, integer, numeric, pgTable, text, timestamp, uuid } = await load('drizzle-orm/pg-core');

const { compileRowMapper } = await import(pathToFileURL(path.join(repoRoot, 'apps/api/dist/db/row-mapper.js')).href);
const { eq, sql, mapResultRow } = drizzleOrm;
const parents = pgTable('parents', {
  id: uuid('id').primaryKey(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull(),
  takenOn: date('taken_on'),
  amount: numeric('amount'),
  note: text('note'),
  supersedesId: uuid('supersedes_id'),
});
const children = pgTable('children', {
  id: uuid('id').primaryKey(),
  parentId: uuid('parent_id'),
  note: text('note'),
  rank: integer('rank'),
});
const others = pgTable('others', { id: uuid('id').primaryKey(), label: text('label') });
const q = drizzle
  .mock()
  .select({
    p: parents,
    c: children,
    o: { id: others.id, label: others.label },
    count: sql`count(*)`.mapWith(Number),
    amended: sql`true`,
  })
  .from(parents)
  .leftJoin(children, eq(children.parentId, parents.id))
  .leftJoin(others, eq(others.id, parents.id))
  .prepare('bench');
const ROWS = Array.from({ length: 2000 }, (_, i) => [
  `p${i}`,
  '2026-12-03 07:00:00.123+00',
  '2026-12-01',
  '12.50',
  i % 3 ? 'note' : null,
  null,
  ...(i % 2 ? [`c${i}`, `p${i}`, 'n', i] : [null, null, null, null]),
  ...(i % 5 ? [`o${i}`, 'L'] : [null, null]),
  String(i),
  true,
]);
const compiled = compileRowMapper(q.fields, q.joinsNotNullableMap);
const mappers = { drizzle: (row) => mapResultRow(q.fields, row, q.joinsNotNullableMap), compiled };
const time = (map) => {
  const t = process.hrtime.bigint();
  let sink = 0;
  for (let k = 0; k < 50; k += 1) for (const row of ROWS) sink += map(row).p === null ? 1 : 0;
  return { ns: Number(process.hrtime.bigint() - t) / (50 * ROWS.length), sink };
};
for (const map of Object.values(mappers)) time(map); // warm-up
const runs = { drizzle: [], compiled: [] };
for (let round = 0; round < 5; round += 1)
  for (const [name, map] of Object.entries(mappers)) runs[name].push(time(map).ns);
const median = (xs) => [...xs].sort((a, b) => a - b)[2];
console.log(
  `load average ${(await import('node:os'))
    .loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}`,
);
for (const [name, xs] of Object.entries(runs))
  console.log(`${name.padEnd(9)} ${median(xs).toFixed(0)} ns/row (runs ${xs.map((x) => x.toFixed(0)).join(', ')})`);
console.log(`compiled ÷ drizzle: ${(median(runs.compiled) / median(runs.drizzle)).toFixed(2)}`);
