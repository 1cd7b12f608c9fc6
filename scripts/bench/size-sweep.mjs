// Issue 13's goal 2 as a class, not four endpoints: every signed-in GET route of the API
// (`apiRoutes` of the contracts), on the demo database and on the large practice of
// `npm run bench` (10 000 patients, 15 years), side by side. For each route it prints the median
// time on each database, their ratio, and what PostgreSQL did for it on the large practice: every
// read statement the API ran (captured in the API process by capture-sql.mjs) is explained with
// `EXPLAIN (ANALYZE, BUFFERS)` and its parameters, and any sequential scan of a table holding more
// than `--big` rows is named. A read whose cost follows the practice's size instead of the
// patient's shows here as a ratio well above 1 and as a scan of a big table. Each route is read as
// the practice's dentist (or administrator), and again as the referring surgeon where a share opens it.
// Measures only; asserts nothing. The large practice must exist: run `npm run bench` once first.
// Usage: node scripts/bench/size-sweep.mjs [--runs 5] [--big 5000] [--only <path substring>]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { apiRoutes } from '@torquetrail/contracts';
import { API_NODE_OPTIONS, app, repoRoot } from '../lib/config.mjs';
import { benchEnv, withOwner } from '../lib/bench-databases.mjs';
import { waitForPort } from '../lib/proc.mjs';
import { startServices } from '../services.mjs';

const { values: args } = parseArgs({
  options: {
    runs: { type: 'string', default: '5' },
    big: { type: 'string', default: '5000' },
    only: { type: 'string' },
    out: { type: 'string', default: path.join(repoRoot, 'bench/results') },
  },
});
const RUNS = Number(args.runs);
// A statement this slow on the large practice has its plan saved even without a big scan.
const SLOW_MS = 50;
const BIG = Number(args.big);
const DATABASES = { demo: 'torquetrail_bench_demo', large: 'torquetrail_bench_large' };
const PORTS = { demo: app.port + 1003, large: app.port + 1004 };
const SIGN_INS = [
  ['dentist', 'ines.calloway@larkspur.example'],
  ['admin', 'odile.park@larkspur.example'],
  // The referring surgeon of another practice, who reads through the demo's shares (of LL-1001 and
  // others): their statements take other paths (the shares in the where clause).
  ['surgeon', 'rafael.imbert@northgate.example'],
];
/** The practice's own readers: each route is measured as the first of them it answers. */
const PRACTICE_ROLES = ['dentist', 'admin'];
const PASSWORD = 'ledger-demo-2026';
// Query strings for the routes that need one to answer; the rest are asked without.
const QUERIES = {
  '/patients': '?search=whit',
  '/patients/duplicates': '?familyName=Whitcombe&birthDate=1955-04-17',
  '/lot-lookup': '?by=lot&q=LT',
  '/lot-lookup/csv': '?by=lot&q=LT',
  '/recalls/desk': '?filter=all&sort=dueOn&dir=asc',
  '/recalls/desk/csv': '?filter=overdue&sort=dueOn&dir=asc',
};
// Not reads of the database worth sweeping: public routes, one-off tokens, import runs.
const SKIPPED = new Set(['/lab-files/:token', '/imports/progress/:runId']);

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];

/** The ids each route's parameters take on one database: the demo's Harold Whitcombe (LL-1001) and what is his. */
async function targetsOf(database) {
  return withOwner(database, async (c) => {
    const one = async (sql) => (await c.query(sql)).rows[0]?.id ?? null;
    const patient = await one(`select id from patients where chart_number = 'LL-1001'`);
    if (!patient) throw new Error(`${database}: no LL-1001; run npm run bench first`);
    return {
      patient,
      site: await one(`select id from implant_sites where patient_id = '${patient}' and fdi = 35`),
      restoration: await one(
        `select id from restorations where patient_id = '${patient}' and supersedes_id is null order by created_at limit 1`,
      ),
      radiograph: await one(`select id from radiographs where patient_id = '${patient}' order by taken_on limit 1`),
      component: await one(`select id from components where supersedes_id is null order by id limit 1`),
      wrench: await one(`select id from torque_wrenches order by id limit 1`),
      labPrescription: await one(`select id from lab_prescriptions order by id limit 1`),
      scanFile: await one(`select id from scan_files order by id limit 1`),
    };
  });
}

/** The URL of a route on one database, or null when that database has nothing to ask it about. */
function urlOf(route, t) {
  const byPrefix = [
    ['/patients/:id', t.patient],
    ['/recalls/patients/:id', t.patient],
    ['/sites/:id', t.site],
    ['/recalls/sites/:id', t.site],
    ['/restorations/:id', t.restoration],
    ['/radiographs/:id', t.radiograph],
    ['/catalogue/components/:id', t.component],
    ['/wrenches/:id', t.wrench],
    ['/lab-prescriptions/:id', t.labPrescription],
    ['/scan-files/:id', t.scanFile],
  ];
  let url = route.path;
  if (url.includes(':')) {
    const match = byPrefix.find(([prefix]) => url.startsWith(prefix));
    if (!match || !match[1]) return null;
    url = url.replace(':id', match[1]);
  }
  return `/api${url}${QUERIES[route.path] ?? ''}`;
}

async function startApi(name, captureFile) {
  fs.writeFileSync(captureFile, '');
  const port = PORTS[name];
  const child = spawn(
    process.execPath,
    [...API_NODE_OPTIONS, '--import', path.join(repoRoot, 'scripts/bench/capture-sql.mjs'), 'apps/api/dist/main.js'],
    {
      cwd: repoRoot,
      env: {
        ...process.env,
        ...benchEnv(DATABASES[name]),
        NODE_ENV: 'production',
        APP_URL: `http://127.0.0.1:${port}`,
        COOKIE_SECURE: 'false',
        TT_CAPTURE_SQL: captureFile,
        PORT: String(port),
      },
      stdio: ['ignore', 'ignore', 'inherit'],
    },
  );
  await waitForPort(port, { timeoutMs: 60_000, label: `${name} API` });
  const cookies = {};
  for (const [role, email] of SIGN_INS) {
    const res = await fetch(`http://127.0.0.1:${port}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: `http://127.0.0.1:${port}` },
      body: JSON.stringify({ email, password: PASSWORD }),
    });
    if (!res.ok) throw new Error(`${name}: ${role} sign-in answered ${res.status}`);
    cookies[role] = String(res.headers.get('set-cookie')).split(';')[0];
  }
  return { child, port, cookies, captureFile };
}

async function timed(api, url, cookie) {
  const t = performance.now();
  const res = await fetch(`http://127.0.0.1:${api.port}${url}`, { headers: { cookie } });
  await res.arrayBuffer();
  return { status: res.status, ms: performance.now() - t };
}

/** Who of the practice may read the route: the dentist, else the administrator (the first that gets a 2xx). */
async function roleFor(api, url) {
  let last = null;
  for (const role of PRACTICE_ROLES) {
    last = await timed(api, url, api.cookies[role]);
    if (last.status < 300) return { role, status: last.status };
  }
  return { role: null, status: last.status };
}

const readCapture = (file, from) =>
  fs
    .readFileSync(file)
    .subarray(from) // `from` is a byte offset: the SQL holds non-ASCII text
    .toString('utf8')
    .split('\n')
    .filter(Boolean)
    .map((line) => JSON.parse(line));

/** Every plan node below `node`, with the node itself. */
const nodesOf = (node) => [node, ...(node.Plans ?? []).flatMap(nodesOf)];

async function explainAll(statements, tableRows, planFile) {
  return withOwner(DATABASES.large, async (c) => {
    // The API's connections run without JIT (ADR 0008); so do these.
    await c.query('set jit = off');
    const out = { explained: 0, buffers: 0, sqlMs: 0, bigScans: [] };
    for (const s of statements) {
      // Only reads are explained: EXPLAIN ANALYZE runs the statement, and a read's audit row must not be written twice.
      if (!/^\s*(select|with)\b/i.test(s.text) || /\b(insert|update|delete)\b/i.test(s.text)) continue;
      const [
        {
          'QUERY PLAN': [plan],
        },
      ] = (await c.query(`explain (analyze, buffers, format json) ${s.text}`, s.values)).rows;
      out.explained += 1;
      out.sqlMs += plan['Execution Time'];
      out.buffers += (plan.Plan['Shared Hit Blocks'] ?? 0) + (plan.Plan['Shared Read Blocks'] ?? 0);
      const scans = nodesOf(plan.Plan)
        .filter((n) => n['Node Type'] === 'Seq Scan' && (tableRows.get(n['Relation Name']) ?? 0) > BIG)
        .map((n) => `${n['Relation Name']} (${tableRows.get(n['Relation Name'])} rows)`);
      out.bigScans.push(...scans);
      if (scans.length || plan['Execution Time'] > SLOW_MS) {
        // The statement and its plan in full, for whoever fixes it.
        const text = (await c.query(`explain (analyze, buffers) ${s.text}`, s.values)).rows.map((r) => r['QUERY PLAN']);
        fs.appendFileSync(planFile, `${s.text}\n-- ${JSON.stringify(s.values)}\n${text.join('\n')}\n\n`);
      }
    }
    return out;
  });
}

/** One route as one reader on both databases: times, statements and plans. */
async function measure(route, urls, role) {
  const times = { demo: [], large: [] };
  await timed(apis.demo, urls.demo, apis.demo.cookies[role]);
  for (let i = 0; i < RUNS; i += 1) {
    // Alternating, so both databases see the same machine.
    for (const name of i % 2 ? ['large', 'demo'] : ['demo', 'large']) {
      times[name].push((await timed(apis[name], urls[name], apis[name].cookies[role])).ms);
    }
  }
  await new Promise((r) => setTimeout(r, 50));
  const from = fs.statSync(apis.large.captureFile).size;
  await timed(apis.large, urls.large, apis.large.cookies[role]);
  await new Promise((r) => setTimeout(r, 100));
  const statements = readCapture(apis.large.captureFile, from);
  const planFile = path.join(
    args.out,
    'size-sweep-plans',
    `${route.path.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '')}${role === 'surgeon' ? '.surgeon' : ''}.txt`,
  );
  fs.rmSync(planFile, { force: true });
  const plans = await explainAll(statements, tableRows, planFile);
  const row = {
    path: route.path,
    role,
    demoMs: median(times.demo),
    largeMs: median(times.large),
    statements: statements.length,
    ...plans,
  };
  row.ratio = row.largeMs / row.demoMs;
  console.log(
    `${route.path.padEnd(42)} ${row.role.padEnd(7)} demo ${row.demoMs.toFixed(1).padStart(6)} ms  large ${row.largeMs
      .toFixed(1)
      .padStart(6)} ms  ×${row.ratio.toFixed(2)}  ${row.statements} SQL, ${row.buffers} buffers${
      row.bigScans.length ? `  SEQ SCAN ${[...new Set(row.bigScans)].join(', ')}` : ''
    }`,
  );
  return row;
}

await startServices();
const tableRows = await withOwner(
  DATABASES.large,
  async (c) =>
    new Map(
      (await c.query(`select relname, reltuples::bigint as n from pg_class where relkind = 'r'`)).rows.map((r) => [
        r.relname,
        Number(r.n),
      ]),
    ),
);
fs.rmSync(path.join(args.out, 'size-sweep-plans'), { recursive: true, force: true });
fs.mkdirSync(path.join(args.out, 'size-sweep-plans'), { recursive: true });
const scratch = fs.mkdtempSync(path.join(repoRoot, '.local/size-sweep-'));
const apis = {
  demo: await startApi('demo', path.join(scratch, 'demo.sql.jsonl')),
  large: await startApi('large', path.join(scratch, 'large.sql.jsonl')),
};
const targets = { demo: await targetsOf(DATABASES.demo), large: await targetsOf(DATABASES.large) };
const rows = [];
try {
  for (const route of apiRoutes) {
    if (route.method !== 'get' || !route.signedIn || SKIPPED.has(route.path)) continue;
    if (args.only && !route.path.includes(args.only)) continue;
    const urls = { demo: urlOf(route, targets.demo), large: urlOf(route, targets.large) };
    if (!urls.demo || !urls.large) {
      rows.push({ path: route.path, note: 'nothing to ask it about in one of the databases' });
      continue;
    }
    const access = await roleFor(apis.large, urls.large);
    if (!access.role) {
      rows.push({ path: route.path, note: `answered ${access.status} to every role` });
      continue;
    }
    rows.push(await measure(route, urls, access.role));
    // The surgeon too, wherever a share lets them read it.
    const asSurgeon = await timed(apis.large, urls.large, apis.large.cookies.surgeon);
    if (asSurgeon.status < 300) rows.push(await measure(route, urls, 'surgeon'));
  }
} finally {
  await Promise.all(
    Object.values(apis).map((api) => new Promise((resolve) => api.child.once('exit', resolve).kill('SIGTERM'))),
  );
  fs.rmSync(scratch, { recursive: true, force: true });
}

const measured = rows.filter((r) => r.role);
const lines = [
  `# Size sweep — ${new Date().toISOString()}`,
  '',
  `Every signed-in GET route on the demo database and on the large practice (${tableRows.get('patients')} patients),`,
  'as the dentist (or the administrator where only they may read it), and again as the referring surgeon wherever',
  'a share lets them read it;',
  `median of ${RUNS} alternating requests each; the large practice's read statements explained with`,
  `EXPLAIN (ANALYZE, BUFFERS). "Scans" names any sequential scan of a table over ${BIG} rows; the plans of those`,
  `statements, and of any taking over ${SLOW_MS} ms, are in size-sweep-plans/. scripts/bench/size-sweep.mjs.`,
  '',
  '| route | as | demo ms | large ms | large ÷ demo | SQL | buffers | SQL ms (large) | scans of big tables |',
  '|---|---|---|---|---|---|---|---|---|',
  ...measured.map(
    (r) =>
      `| ${r.path} | ${r.role} | ${r.demoMs.toFixed(1)} | ${r.largeMs.toFixed(1)} | ${r.ratio.toFixed(2)} | ${
        r.statements
      } | ${r.buffers} | ${r.sqlMs.toFixed(1)} | ${[...new Set(r.bigScans)].join(', ') || '—'} |`,
  ),
  '',
  ...rows.filter((r) => !r.role).map((r) => `- ${r.path}: not measured, ${r.note}.`),
  '',
];
fs.writeFileSync(path.join(args.out, 'size-sweep.md'), lines.join('\n'));
fs.writeFileSync(
  path.join(args.out, 'size-sweep.json'),
  JSON.stringify({ at: new Date().toISOString(), rows }, null, 2),
);
console.log(
  `\n${measured.length} routes measured; written to ${path.relative(repoRoot, args.out)}/size-sweep.{md,json}`,
);
