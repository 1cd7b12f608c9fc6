// Recall desk at scale: seeds one practice with N patients (default 10 000) into a scratch
// database (torquetrail_bench, recreated each run), each with 1–4 implants, a few years of exams
// and a scheduled recall, then times the desk query (the API's own repository function from
// apps/api/dist) for each filter and sort, first page and a deep page, plus the CSV query.
// Prints timings only; nothing is asserted. Usage: node scripts/bench-recall-desk.mjs [patients]
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { apiEnvironment, repoRoot, s3 } from './lib/config.mjs';
import { withOwner } from './lib/bench-databases.mjs';
import { migrateDatabase } from './lib/bootstrap.mjs';
import { ensureDatabase } from './lib/postgres.mjs';
import { startServices } from './services.mjs';

const PATIENTS = Number(process.argv[2] ?? 10_000);
const DATABASE = 'torquetrail_bench';
const RUNS = 7;
const dist = (p) => pathToFileURL(path.join(repoRoot, 'apps/api/dist', p)).href;

await startServices();
await ensureDatabase(DATABASE, { fresh: true });
const env = apiEnvironment({
  database: DATABASE,
  bucket: s3.bucket,
  jwtSecret: 'bench-only-secret-bench-only-secret-0123',
  port: 0,
});
await migrateDatabase(DATABASE, env);

const { createPool, createDatabase } = await import(dist('db/database.js'));
const { queryDesk } = await import(dist('recalls/desk.repository.js'));
const { copyDeskCsv } = await import(dist('recalls/desk-csv.repository.js'));
const pool = createPool(env.DATABASE_URL);
const db = createDatabase(pool);
const today = new Date().toISOString().slice(0, 10);

const t0 = performance.now();
const [{ id: practiceId }] = (await pool.query(`insert into practices (name) values ('Bench practice') returning id`))
  .rows;
const [{ id: userId }] = (
  await pool.query(
    `insert into users (practice_id, email, display_name, role, password_hash) values ($1, 'bench@bench.example', 'Bench Hygienist', 'hygienist', 'x') returning id`,
    [practiceId],
  )
).rows;
await pool.query(
  `insert into patients (practice_id, chart_number, given_name, family_name, birth_date, email, smoker, periodontitis_history)
   select $1, 'B-' || lpad(g::text, 6, '0'), 'Given' || (g % 997), 'Family' || lpad((g * 7919 % 100000)::text, 5, '0'),
          date '1950-01-01' + (g % 15000), 'p' || g || '@bench.example', g % 5 = 0, g % 7 = 0
   from generate_series(1, $2) g`,
  [practiceId, PATIENTS],
);
// 1–4 implant sites per patient at distinct positions.
await pool.query(
  `insert into implant_sites (practice_id, patient_id, fdi, status)
   select $1, p.id, (array[14, 24, 36, 46])[k], case when k = 4 and p.chart_number like '%3' then 'planned'::site_status else 'restored'::site_status end
   from patients p cross join generate_series(1, 4) k
   where p.practice_id = $1 and k <= 1 + (hashtext(p.id::text) & 3)`,
  [practiceId],
);
// Exams every 6 months over the last 2–4 years for examinable sites.
await pool.query(
  `insert into recall_exams (practice_id, patient_id, site_id, visit_id, examined_on, examiner_id, mobility, status, reasons, flags, rules_version, rule_options)
   select $1, s.patient_id, s.id, gen_random_uuid(), current_date - (n * 182 + (hashtext(s.id::text) & 63)), $2, false,
          (case when (hashtext(s.id::text || n) & 31) = 0 then 'peri-implantitis' when (hashtext(s.id::text || n) & 7) = 0 then 'mucositis' else 'health' end)::peri_implant_status,
          '[]'::jsonb, '[]'::jsonb, 'bench', '{}'::jsonb
   from implant_sites s cross join generate_series(0, 7) n
   where s.practice_id = $1 and s.status = 'restored' and n <= 3 + (hashtext(s.patient_id::text) & 3)`,
  [practiceId, userId],
);
// One scheduled recall per patient, from 90 days overdue to 180 days ahead; an older one done.
await pool.query(
  `insert into recalls (practice_id, patient_id, due_on, status)
   select $1, p.id, current_date + ((hashtext(p.id::text) & 255) - 90), 'scheduled'::recall_status from patients p where p.practice_id = $1
   union all
   select $1, p.id, current_date - 200, 'done'::recall_status from patients p where p.practice_id = $1`,
  [practiceId],
);
// As the owner: the API's role may not ANALYZE (PostgreSQL skips the tables with a warning), and
// the timings would then come from plans over unsampled tables.
await withOwner(DATABASE, (owner) => owner.query('analyze'));
const counts = (
  await pool.query(
    `select (select count(*) from patients) p, (select count(*) from implant_sites) s, (select count(*) from recall_exams) e, (select count(*) from recalls) r`,
  )
).rows[0];
console.log(
  `seeded ${counts.p} patients, ${counts.s} implant sites, ${counts.e} exams, ${counts.r} recalls in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
);

const scope = { practiceId, sharedPatientIds: [] };
const cases = [
  ['all, by due date, page 1', { filter: 'all', sort: 'dueOn', dir: 'asc' }, 50, 0],
  ['all, by due date, page 100', { filter: 'all', sort: 'dueOn', dir: 'asc' }, 50, 4950],
  ['all, by name, page 1', { filter: 'all', sort: 'name', dir: 'asc' }, 50, 0],
  ['all, by last exam desc, page 1', { filter: 'all', sort: 'lastExamOn', dir: 'desc' }, 50, 0],
  ['overdue, most overdue first', { filter: 'overdue', sort: 'overdueDays', dir: 'desc' }, 50, 0],
  ['due this week', { filter: 'due-this-week', sort: 'dueOn', dir: 'asc' }, 50, 0],
  ['peri-implantitis last time', { filter: 'peri-implantitis-last', sort: 'dueOn', dir: 'asc' }, 50, 0],
  ['search "family12"', { filter: 'all', sort: 'dueOn', dir: 'asc', search: 'family12' }, 50, 0],
  ['every row, as the screen reads them', { filter: 'all', sort: 'dueOn', dir: 'asc' }, 50_000, 0],
];
console.log(
  `\n${'query'.padEnd(34)} ${'rows'.padStart(6)} ${'total'.padStart(6)} ${'median ms'.padStart(10)} ${'max ms'.padStart(8)}`,
);
for (const [name, q, limit, offset] of cases) {
  const times = [];
  let last;
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    last = await queryDesk(db, pool, scope, today, { archived: 'active', ...q }, { limit, offset });
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  console.log(
    `${name.padEnd(34)} ${String(last.rows.length).padStart(6)} ${String(last.total).padStart(6)} ${times[Math.floor(RUNS / 2)].toFixed(1).padStart(10)} ${times[RUNS - 1].toFixed(1).padStart(8)}`,
  );
}
// The CSV export as the API writes it since session 10: PostgreSQL's COPY, every byte read.
const csvTimes = [];
let csv = { bytes: 0, lines: 0 };
for (let i = 0; i < RUNS; i += 1) {
  const start = performance.now();
  const chunks = await copyDeskCsv(
    pool,
    scope,
    today,
    { filter: 'all', sort: 'dueOn', dir: 'asc', archived: 'active' },
    50_000,
    true,
  );
  csv = { bytes: 0, lines: 0 };
  for await (const chunk of chunks) {
    csv.bytes += chunk.length;
    for (const byte of chunk) if (byte === 10) csv.lines += 1;
  }
  csvTimes.push(performance.now() - start);
}
csvTimes.sort((a, b) => a - b);
console.log(
  `${'CSV export (COPY, all rows)'.padEnd(34)} ${String(csv.lines - 1).padStart(6)} ${`${Math.round(csv.bytes / 1024)}kB`.padStart(6)} ${csvTimes[Math.floor(RUNS / 2)].toFixed(1).padStart(10)} ${csvTimes[RUNS - 1].toFixed(1).padStart(8)}`,
);
await pool.end();
