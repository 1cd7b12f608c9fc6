// The legacy import at scale (issue 14): a generated 50 000-row CSV (5 000 invented patients,
// each with a placement, a delivery, a screw, two torque entries and five recall exams) sent to
// the dry run and then to the import, through the API over HTTP as the practice admin, while
// the progress route is polled. Prints the file size, each phase's time and the progress seen;
// nothing is asserted. Needs a prior `npm run build`.
// Usage: node scripts/bench-import.mjs [rows]
import http from 'node:http';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { pathToFileURL } from 'node:url';
import { apiEnvironment, repoRoot, s3 } from './lib/config.mjs';
import { migrateDatabase } from './lib/bootstrap.mjs';
import { ensureDatabase } from './lib/postgres.mjs';
import { startServices } from './services.mjs';

const ROWS = Number(process.argv[2] ?? 50_000);
const DATABASE = 'torquetrail_bench_import';
const load = (file) => import(pathToFileURL(path.join(repoRoot, 'apps/api/dist', file)).href);

// ---- the file -------------------------------------------------------------------------------------
const COLUMNS =
  'event,chart_number,family_name,given_name,birth_date,fdi,date,system,platform,length_mm,lot,part_ref,torque_ncm,torque_reason,restoration_kind,retention,material,pd_mb,pd_b,pd_db,pd_ml,pd_l,pd_dl,bop,bone_level_mm';
const FAMILY = ['Arbogast', 'Belcourt', 'Cathmore', 'Dunleavy', 'Eskerholt', 'Fairweather', 'Greaves', 'Holloway'];
const GIVEN = ['Ada', 'Bram', 'Cleo', 'Dov', 'Elin', 'Fenn', 'Greta', 'Hale', 'Isla', 'Jory'];
const FDIS = [14, 15, 24, 25, 36, 46, 35, 45];
function buildFile(rows) {
  const lines = [COLUMNS];
  for (let i = 0; lines.length - 1 < rows; i += 1) {
    const chart = `BENCH-${String(i).padStart(6, '0')}`;
    const who = `${chart},${FAMILY[i % FAMILY.length]},${GIVEN[i % GIVEN.length]} ${i},19${50 + (i % 40)}-0${1 + (i % 9)}-1${i % 9}`;
    const fdi = FDIS[i % FDIS.length];
    const at = (y, m) => `20${String(y).padStart(2, '0')}-${String(m).padStart(2, '0')}-15`;
    const y = 5 + (i % 10);
    const cells = (event, date, rest) => `${event},${who},${fdi},${date},${rest}`;
    const depths = (d) => `${d},${d},${d},${d},${d},${d}`;
    const patient = [
      cells('placement', at(y, 2), `Solvra CN,Solvra CN 4.3,10,L${i},,,,,,,,,,,,,,`),
      cells('delivery', at(y, 6), `,,,,,,,single-crown,screw-to-implant,zirconia,,,,,,,,`),
      cells('part', at(y, 6), `,,,P${i},SCN-43-PSI,,,,,,,,,,,,,`),
      cells('torque', at(y, 6), `,,,,SCN-43-PSI,25,initial-seating,,,,,,,,,,,`),
      cells('torque', at(y, 6), `,,,,SCN-43-PSI,24.5,re-torque-after-settling,,,,,,,,,,,`),
    ];
    for (let e = 1; e <= 5; e += 1)
      patient.push(
        cells(
          'exam',
          at(y + e, 7),
          `,,,,,,,,,,${depths(e < 4 ? 3 : 4)},${e === 5 ? 'b' : 'none'},${(0.5 + e * 0.1).toFixed(1)}`,
        ),
      );
    lines.push(...patient.slice(0, rows - (lines.length - 1)));
  }
  return Buffer.from(`${lines.join('\r\n')}\r\n`);
}

// ---- the app --------------------------------------------------------------------------------------
await startServices();
await ensureDatabase(DATABASE, { fresh: true });
const env = {
  ...apiEnvironment({ database: DATABASE, bucket: s3.testBucket, jwtSecret: 'bench-'.repeat(8), port: 0 }),
  NODE_ENV: 'test',
  LOG_LEVEL: 'silent',
};
await migrateDatabase(DATABASE, env);
Object.assign(process.env, env);
const { createPool, createDatabase } = await load('db/database.js');
const { seedDemo } = await load('seed/demo.js');
const { createApp } = await load('app.js');
const { parseEnv } = await load('config/env.js');
const { StorageService } = await load('storage/storage.service.js');
const pool = createPool(env.DATABASE_URL);
const db = createDatabase(pool);
// The seed puts the demo radiographs' files into the S3 fake too.
const storage = new StorageService(parseEnv({ ...process.env, WEB_DIST: '' }));
await db.transaction((tx) => seedDemo(tx, new Date().toISOString().slice(0, 10), storage));
const app = await createApp(parseEnv({ ...process.env, WEB_DIST: '' }), { logger: false });
await app.listen(0, '127.0.0.1');
const { port } = app.getHttpServer().address();

function request(method, url, { body, type, cookie } = {}) {
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        method,
        path: url,
        headers: {
          ...(body ? { 'content-type': type, 'content-length': body.length } : {}),
          ...(cookie ? { cookie } : {}),
        },
      },
      (res) => {
        const chunks = [];
        res.on('data', (c) => chunks.push(c));
        res.on('end', () =>
          resolve({ status: res.statusCode, headers: res.headers, text: Buffer.concat(chunks).toString() }),
        );
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

const signIn = await request('POST', '/api/auth/sign-in', {
  type: 'application/json',
  body: Buffer.from(JSON.stringify({ email: 'odile.park@larkspur.example', password: 'ledger-demo-2026' })),
});
const cookie = String(signIn.headers['set-cookie']).split(';')[0];

const t0 = Date.now();
const file = buildFile(ROWS);
console.log(
  `[bench] import file: ${ROWS} rows, ${(file.length / 1024 / 1024).toFixed(1)} MB, generated in ${Date.now() - t0} ms`,
);

/** Sends the file and polls its progress every 500 ms until the reply is in. */
async function timed(label, url) {
  const runId = randomUUID();
  const seen = [];
  const state = { done: false };
  const poll = (async () => {
    while (!state.done) {
      await new Promise((r) => setTimeout(r, 500));
      const p = await request('GET', `/api/imports/progress/${runId}`, { cookie });
      if (p.status === 200) seen.push(JSON.parse(p.text));
    }
  })();
  const start = Date.now();
  const res = await request('POST', `${url}?fileName=bench.csv&runId=${runId}`, {
    type: 'application/octet-stream',
    body: file,
    cookie,
  });
  const ms = Date.now() - start;
  state.done = true;
  await poll;
  const last = seen.at(-1);
  console.log(
    `[bench] ${label}: ${res.status} in ${(ms / 1000).toFixed(1)} s; ${seen.length} progress polls, ` +
      `last: ${last ? `${last.phase}, ${last.rowsRead} rows read, ${last.rowsWritten} records written` : 'none'}`,
  );
  return JSON.parse(res.text);
}

const report = await timed('dry run', '/api/imports/dry-run');
console.log(
  `[bench] dry run counts ${JSON.stringify(report.counts)}, ${report.errors} errors, ${report.warnings} warnings`,
);
const result = await timed('import', '/api/imports');
console.log(`[bench] import written: ${result.written}, counts ${JSON.stringify(result.counts)}`);
const again = await timed('same file again', '/api/imports');
console.log(`[bench] second import written: ${again.written}`);
await app.close();
await pool.end();
process.exit(0);
