// The Site-file benchmark (issue 13; docs/performance.md): the Site file's reads against their
// floor, on the demo database and on the large practice, plus the Recall desk and its CSV export
// at size. Prints one table and writes bench/results/site-file.{json,md} and the desk's EXPLAIN
// files. Measures only: nothing is asserted and `npm test` never runs it.
// Usage: node scripts/bench-site-file.mjs [--seconds 3] [--repeats 3] [--patients 10000] [--reseed]
//        node scripts/bench-site-file.mjs --desk [--replies <dir>]   (only the large practice's Recall
//        desk, CSV and EXPLAIN files, to bench/results/desk.{json,md}; --replies saves each desk
//        reply and both CSV orders there, to compare two builds byte for byte)
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { API_NODE_OPTIONS, repoRoot } from './lib/config.mjs';
import { benchEnv, cloneDatabase, ownerUrl, prepareDemoDatabase, withOwner } from './lib/bench-databases.mjs';
import { seedLargePractice } from './lib/bench-large-seed.mjs';
import { ensureChromium } from './lib/bootstrap.mjs';
import { waitForPort } from './lib/proc.mjs';
import { startServices } from './services.mjs';
import { API_PG_OPTIONS, explainDesk, writeResults } from './bench/site-file-report.mjs';
import { measureWebFirstLoad } from './bench/web-first-load.mjs';

const { values: args } = parseArgs({
  options: {
    seconds: { type: 'string', default: '3' },
    repeats: { type: 'string', default: '3' },
    patients: { type: 'string', default: '10000' },
    reseed: { type: 'boolean', default: false },
    desk: { type: 'boolean', default: false },
    replies: { type: 'string' },
  },
});
const SECONDS = Number(args.seconds);
const REPEATS = Number(args.repeats);
const PATIENTS = Number(args.patients);
const CONNECTIONS = [8, 32];
const DEMO_DB = 'torquetrail_bench_demo';
const LARGE_DB = 'torquetrail_bench_large';
const API_PORT = 3000 + (Number(process.env.PORT ?? 3000) % 1000) + 1000;
const FLOOR_PORT = API_PORT + 1;
// The large practice's API runs beside the demo one, so the two are measured in turns (goal 2).
const LARGE_API_PORT = API_PORT + 2;
const scratch = path.join(repoRoot, '.local', 'bench');
fs.mkdirSync(scratch, { recursive: true });
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
const log = (line) => console.log(line);

// ---- databases -----------------------------------------------------------------------------
await startServices();
// Before any measuring: installing the browser later would load the machine during a run.
if (!args.desk) await ensureChromium();
const started = performance.now();
const t0 = performance.now();
if (!args.desk) await prepareDemoDatabase(DEMO_DB);
const demoSeedS = (performance.now() - t0) / 1000;
// The large database is kept between runs while what made it is unchanged (its seed, the demo seed,
// the migrations, the size): seeding it is the slowest step of the run.
const fingerprint = createHash('sha256')
  .update(fs.readFileSync(path.join(repoRoot, 'scripts/lib/bench-large-seed.mjs')))
  .update(fs.readFileSync(path.join(repoRoot, 'drizzle/meta/_journal.json')))
  // The demo seed's code, not only its file names: the large practice is a copy of a demo database.
  .update(
    fs
      .readdirSync(path.join(repoRoot, 'apps/api/dist/seed'))
      .filter((file) => file.endsWith('.js'))
      .sort()
      .map((file) => fs.readFileSync(path.join(repoRoot, 'apps/api/dist/seed', file), 'utf8'))
      .join('\0'),
  )
  .update(String(PATIENTS))
  .digest('hex')
  .slice(0, 16);
let largeSeed = { reused: true, seconds: null, counts: null };
if (args.reseed || (await databaseComment(LARGE_DB)) !== fingerprint) {
  log(`seeding the large practice (${PATIENTS} patients) …`);
  if (args.desk) await prepareDemoDatabase(DEMO_DB);
  await cloneDatabase(DEMO_DB, LARGE_DB);
  const seeded = await seedLargePractice(ownerUrl(LARGE_DB), { patients: PATIENTS, log });
  await withOwner('postgres', (c) => c.query(`comment on database "${LARGE_DB}" is '${fingerprint}'`));
  largeSeed = { reused: false, ...seeded };
  log(`large practice seeded in ${seeded.seconds.toFixed(1)} s`);
} else {
  log('large practice unchanged since the last run: reused');
}

async function databaseComment(name) {
  return withOwner('postgres', async (c) => {
    const r = await c.query(`select shobj_description(oid, 'pg_database') as d from pg_database where datname = $1`, [
      name,
    ]);
    return r.rows[0]?.d ?? null;
  });
}

// ---- processes -----------------------------------------------------------------------------
function startProcess(argv, env, port) {
  const child = spawn(process.execPath, argv, {
    cwd: repoRoot,
    env: { ...process.env, ...env, PORT: String(port) },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  return waitForPort(port, { timeoutMs: 60_000, label: argv.at(-1) }).then(() => child);
}
const stop = (child) =>
  new Promise((resolve) => {
    if (child.exitCode !== null) return resolve();
    child.once('exit', resolve);
    child.kill('SIGTERM');
  });
/** CPU time (user + system) the process has used, in ms: a count the machine's load does not change. */
const cpuMs = (pid) => {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  // utime and stime are the 14th and 15th fields of the line, in clock ticks (100 a second on Linux).
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
};

const rssMb = (pid) => {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)[1]) / 1024;
};

async function startApi(database, captureFile, port) {
  fs.writeFileSync(captureFile, '');
  const env = {
    ...benchEnv(database),
    NODE_ENV: 'production',
    APP_URL: `http://127.0.0.1:${port}`,
    COOKIE_SECURE: 'false',
    TT_CAPTURE_SQL: captureFile,
    WEB_DIST: path.join(repoRoot, 'apps/web/dist'),
  };
  // Started as `npm start` starts it (ADR 0007): the memory figures are the deployment's.
  const child = await startProcess(
    [...API_NODE_OPTIONS, '--import', path.join(repoRoot, 'scripts/bench/capture-sql.mjs'), 'apps/api/dist/main.js'],
    env,
    port,
  );
  return child;
}

async function request(port, url, { method = 'GET', body, cookie } = {}) {
  const res = await fetch(`http://127.0.0.1:${port}${url}`, {
    method,
    headers: {
      ...(body ? { 'content-type': 'application/json', origin: `http://127.0.0.1:${port}` } : {}),
      ...(cookie ? { cookie } : {}),
    },
    body: body ? JSON.stringify(body) : undefined,
  });
  return { status: res.status, headers: res.headers, body: Buffer.from(await res.arrayBuffer()) };
}

// ---- the endpoints ---------------------------------------------------------------------------
// Looked up in each database: the seed draws random ids, and the large practice is a copy of the
// demo database of the run that seeded it, so a reused large database has other ids than this run's
// fresh demo database (its URLs answered 404 there).
async function targetsOf(database) {
  const target = await withOwner(database, async (c) => {
    const r = await c.query(
      `select s.id as site, p.id as patient from implant_sites s join patients p on p.id = s.patient_id where p.chart_number = 'LL-1001' and s.fdi = 35`,
    );
    return r.rows[0];
  });
  if (!target) throw new Error(`${database}: no site 35 of LL-1001 (reseed with --reseed)`);
  return target;
}
const endpointsOf = (target) => [
  ['site detail', `/api/sites/${target.site}`],
  ['Timeline', `/api/sites/${target.site}/timeline`],
  ['exam history', `/api/recalls/sites/${target.site}/exams`],
  ['radiograph list', `/api/patients/${target.patient}/radiographs`],
];
const DESK = [
  ['all, by due date', '/api/recalls/desk?filter=all&sort=dueOn&dir=asc'],
  ['all, by name', '/api/recalls/desk?filter=all&sort=name&dir=asc'],
  ['all, by last exam', '/api/recalls/desk?filter=all&sort=lastExamOn&dir=desc'],
  ['overdue', '/api/recalls/desk?filter=overdue&sort=overdueDays&dir=desc'],
  ['due this week', '/api/recalls/desk?filter=due-this-week&sort=dueOn&dir=asc'],
  ['peri-implantitis last time', '/api/recalls/desk?filter=peri-implantitis-last&sort=dueOn&dir=asc'],
  ['search', '/api/recalls/desk?filter=all&sort=dueOn&dir=asc&search=family12'],
];
const CSV_URL = '/api/recalls/desk/csv?filter=all&sort=dueOn&dir=asc';
// The replies compared byte for byte between two builds (--replies): beyond DESK, every order in
// both directions, the other filters, a later page and one past the end, archived patients, both CSV orders.
const COMPARED = [
  ...DESK.map(([, url]) => url),
  '/api/recalls/desk?filter=all&sort=dueOn&dir=desc&page=3',
  '/api/recalls/desk?filter=all&sort=name&dir=desc&page=2',
  '/api/recalls/desk?filter=all&sort=lastExamOn&dir=asc',
  '/api/recalls/desk?filter=all&sort=overdueDays&dir=asc&page=40',
  '/api/recalls/desk?filter=all&sort=overdueDays&dir=desc&page=2',
  '/api/recalls/desk?filter=overdue&sort=name&dir=asc&page=2',
  '/api/recalls/desk?filter=provisional-overdue&sort=dueOn&dir=asc',
  '/api/recalls/desk?filter=due-this-week&sort=overdueDays&dir=asc',
  '/api/recalls/desk?filter=peri-implantitis-last&sort=lastExamOn&dir=desc&pageSize=200',
  '/api/recalls/desk?filter=all&sort=name&dir=asc&archived=all&page=150',
  '/api/recalls/desk?filter=all&sort=dueOn&dir=asc&archived=archived',
  '/api/recalls/desk?filter=all&sort=name&dir=asc&page=1000',
  CSV_URL,
  '/api/recalls/desk/csv?filter=all&sort=name&dir=desc',
];

const readCapture = (file, from) =>
  fs
    .readFileSync(file, 'utf8')
    .slice(from)
    .split('\n')
    .filter(Boolean)
    .map((line) => JSON.parse(line))
    // pg-boss polls on its own connections; its statements are not the request's.
    .filter((s) => !/pgboss/i.test(s.text));

/** The request's statements in round trips: a statement that began before the others ended runs beside them. */
function roundTrips(statements) {
  const groups = [];
  let end = -Infinity;
  for (const s of [...statements].sort((a, b) => a.start - b.start)) {
    if (s.start >= end) groups.push([]);
    groups.at(-1).push({ text: s.text, values: s.values });
    end = Math.max(end, s.end);
  }
  return groups;
}

async function captureRequest(port, captureFile, cookie, url) {
  await request(port, url, { cookie });
  await new Promise((r) => setTimeout(r, 100));
  const from = fs.statSync(captureFile).size;
  const reply = await request(port, url, { cookie });
  await new Promise((r) => setTimeout(r, 100));
  const statements = readCapture(captureFile, from);
  return { reply, statements, groups: roundTrips(statements) };
}

/** One autocannon run; every response's time is kept, for the p95 autocannon does not report. */
function load(port, url, cookie, connections) {
  return new Promise((resolve, reject) => {
    const times = [];
    const instance = autocannon(
      { url: `http://127.0.0.1:${port}${url}`, connections, duration: SECONDS, headers: { cookie } },
      (error, result) => (error ? reject(error) : resolve({ result, times })),
    );
    instance.on('response', (_client, _status, _bytes, ms) => times.push(ms));
  });
}
const percentile = (xs, p) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;
};

/**
 * One database's API, started and signed in, with the Site file's replies and statements captured
 * (`out` collects its figures).
 */
async function openApi(database, port) {
  const captureFile = path.join(scratch, `${database}.sql.jsonl`);
  const api = await startApi(database, captureFile, port);
  const signIn = await request(port, '/api/auth/sign-in', {
    method: 'POST',
    body: { email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' },
  });
  if (signIn.status !== 200 && signIn.status !== 201) throw new Error(`sign-in answered ${signIn.status}`);
  const cookie = String(signIn.headers.get('set-cookie')).split(';')[0];
  const out = { endpoints: {}, desk: {}, csv: null, web: null, peakRssMb: 0 };
  const target = await targetsOf(database);
  const endpoints = args.desk ? [] : endpointsOf(target);
  const replay = { routes: {} };
  for (const [name, url] of endpoints) {
    const { reply, statements, groups } = await captureRequest(port, captureFile, cookie, url);
    if (reply.status !== 200) throw new Error(`${database}: ${name} answered ${reply.status}`);
    replay.routes[url] = {
      status: 200,
      contentType: 'application/json; charset=utf-8',
      body: reply.body.toString(),
      groups,
    };
    out.endpoints[name] = {
      url,
      statements: statements.length,
      roundTrips: groups.length,
      bytes: reply.body.length,
      runs: [],
    };
  }
  return { database, port, api, cookie, captureFile, target, endpoints, replay, out };
}

/** One load run of an API, with its CPU per request and its resident memory sampled throughout. */
async function loadApi(side, url, connections) {
  let peak = 0;
  const sampler = setInterval(() => (peak = Math.max(peak, rssMb(side.api.pid))), 100);
  const cpu = cpuMs(side.api.pid);
  const a = await load(side.port, url, side.cookie, connections);
  clearInterval(sampler);
  side.out.peakRssMb = Math.max(side.out.peakRssMb, peak, rssMb(side.api.pid));
  return summary(a, cpuMs(side.api.pid) - cpu);
}

/**
 * The Site file's endpoints under load: the demo database's API, its floor and the large
 * practice's API one after the other for each endpoint and connection count, so the two ratios
 * (floor ÷ API, demo ÷ large) compare runs made within seconds of each other, whatever else the
 * machine is doing meanwhile.
 */
async function measureSiteFile(demoSide, largeSide) {
  const replayFile = path.join(scratch, `${demoSide.database}.replay.json`);
  fs.writeFileSync(replayFile, JSON.stringify(demoSide.replay));
  const floor = await startProcess(
    ['scripts/bench-floor.mjs', replayFile],
    { DATABASE_URL: benchEnv(demoSide.database).DATABASE_URL, PG_OPTIONS: API_PG_OPTIONS },
    FLOOR_PORT,
  );
  for (const [name, url] of demoSide.endpoints) {
    const [a, f] = [await request(demoSide.port, url, { cookie: demoSide.cookie }), await request(FLOOR_PORT, url)];
    demoSide.out.endpoints[name].sameBytes = a.body.equals(f.body);
  }
  const largeUrl = (name) => largeSide.endpoints.find(([n]) => n === name)[1];
  // Warm the three servers (JIT of V8, PostgreSQL's caches) before anything is kept.
  for (const [name, url] of demoSide.endpoints) {
    await load(demoSide.port, url, demoSide.cookie, 8);
    await load(FLOOR_PORT, url, demoSide.cookie, 8);
    await load(largeSide.port, largeUrl(name), largeSide.cookie, 8);
  }
  for (let repeat = 0; repeat < REPEATS; repeat += 1) {
    for (const connections of CONNECTIONS) {
      for (const [name, url] of demoSide.endpoints) {
        const run = { connections, api: await loadApi(demoSide, url, connections) };
        const floorCpu = cpuMs(floor.pid);
        run.floor = summary(await load(FLOOR_PORT, url, demoSide.cookie, connections), cpuMs(floor.pid) - floorCpu);
        const large = { connections, api: await loadApi(largeSide, largeUrl(name), connections) };
        demoSide.out.endpoints[name].runs.push(run);
        largeSide.out.endpoints[name].runs.push(large);
        log(`  ${name} ${connections}c #${repeat + 1}: ${fmtRun(run)} | large ${fmtRun(large)}`);
      }
    }
  }
  await stop(floor);
}

async function measureDatabase(side, { withFloor }) {
  const { api, cookie, captureFile, target, out } = side;
  const port = side.port;
  if (!withFloor) {
    for (const [name, url] of DESK) {
      const times = [];
      let total = null;
      for (let i = 0; i < 15; i += 1) {
        const t = performance.now();
        const r = await request(port, url, { cookie });
        times.push(performance.now() - t);
        total = JSON.parse(r.body.toString()).total ?? total;
      }
      out.desk[name] = { url, medianMs: median(times.slice(3)), maxMs: Math.max(...times.slice(3)), total };
    }
    out.deskSql = {};
    for (const [name, url] of DESK) {
      const from = fs.statSync(captureFile).size;
      await request(port, url, { cookie });
      await new Promise((r) => setTimeout(r, 100));
      // The desk's own statements (the session's user and the audit row are measured elsewhere); since
      // session 11 the page's overdue lists are a statement of their own (`with late as`, recalls/desk.repository.ts).
      out.deskSql[name] = readCapture(captureFile, from).filter(
        (s) =>
          /recall_summaries|"recalls"|recalls\b|^\s*with late as/.test(s.text) && /^\s*(select|with)/i.test(s.text),
      );
    }
    // The export's statement: the query inside the COPY that writes the CSV (its values are written
    // in), or, for a build from before session 10, as its cursor declared it.
    const from = fs.statSync(captureFile).size;
    await request(port, CSV_URL, { cookie });
    await new Promise((r) => setTimeout(r, 100));
    const copyText = /^copy \(([\s\S]*)\) to stdout with \([^)]*\)$/i;
    const cursorText = /^declare batch_rows no scroll cursor for /i;
    out.deskSql['CSV export'] = readCapture(captureFile, from).flatMap((s) => {
      if (copyText.test(s.text)) return [{ ...s, text: copyText.exec(s.text)[1], asCursor: false }];
      if (cursorText.test(s.text)) return [{ ...s, text: s.text.replace(cursorText, ''), asCursor: true }];
      return [];
    });
    if (args.replies) {
      fs.mkdirSync(args.replies, { recursive: true });
      for (const url of COMPARED) {
        const r = await request(port, url, { cookie });
        fs.writeFileSync(path.join(args.replies, `${url.replace(/[^a-z0-9]+/gi, '-')}.${r.status}`), r.body);
      }
    }
    const csvTimes = [];
    const csvCpu = [];
    let csvPeak = 0;
    let csvBytes = 0;
    const before = rssMb(api.pid);
    for (let i = 0; i < 5; i += 1) {
      const sampler = setInterval(() => (csvPeak = Math.max(csvPeak, rssMb(api.pid))), 20);
      const cpu = cpuMs(api.pid);
      const t = performance.now();
      const r = await request(port, CSV_URL, { cookie });
      csvTimes.push(performance.now() - t);
      csvCpu.push(cpuMs(api.pid) - cpu);
      clearInterval(sampler);
      csvBytes = r.body.length;
    }
    out.csv = {
      medianMs: median(csvTimes.slice(1)),
      // The API process's CPU per export (user + system, 10 ms ticks), whatever the machine's load.
      apiCpuMs: median(csvCpu.slice(1)),
      bytes: csvBytes,
      rssBeforeMb: before,
      rssPeakMb: csvPeak,
    };
  }
  if (withFloor) {
    // The web's first load of Harold's Arch, served by this API from the build (goal 3).
    out.web = await measureWebFirstLoad({
      baseUrl: `http://127.0.0.1:${port}`,
      cookie,
      patientId: target.patient,
      webDist: path.join(repoRoot, 'apps/web/dist'),
    });
    log(`  web: Arch ${out.web.archMs} ms, blank ${out.web.blankMs} ms, JS ${out.web.jsGzipKb.toFixed(1)} KB gzip`);
  }
  await stop(api);
  return out;
}

const summary = ({ result, times }, cpu) => ({
  rps: result.requests.total / SECONDS,
  // The server process's CPU (user + system) per answered request: what the API costs around its
  // SQL whatever the machine's load does to the wall-clock figures (10 ms ticks over the run).
  cpuMsPerRequest: result.requests.total > 0 ? cpu / result.requests.total : null,
  p50: percentile(times, 50),
  p95: percentile(times, 95),
  // Any answer but a 2xx, and requests still unanswered when the run ended, are counted: a run
  // that got no answers at all reads as 0 req/s, never as a fast one.
  errors: result.errors + result.timeouts + result.non2xx,
  unanswered: Math.max(0, result.requests.sent - result.requests.total),
});
const fmtRun = (run) =>
  `API ${run.api.rps.toFixed(0)} req/s p50 ${run.api.p50.toFixed(1)} ms cpu/req ${run.api.cpuMsPerRequest?.toFixed(2)} ms` +
  (run.floor
    ? ` | floor ${run.floor.rps.toFixed(0)} req/s p50 ${run.floor.p50.toFixed(1)} ms cpu/req ${run.floor.cpuMsPerRequest?.toFixed(2)} ms`
    : '') +
  (run.api.errors || run.floor?.errors ? ` | errors API ${run.api.errors}, floor ${run.floor?.errors ?? 0}` : '');

let demo = null;
const largeSide = await openApi(LARGE_DB, LARGE_API_PORT);
if (!args.desk) {
  log('\n== the Site file: demo database (API and floor) and large practice (API), in turns');
  const demoSide = await openApi(DEMO_DB, API_PORT);
  await measureSiteFile(demoSide, largeSide);
  demo = await measureDatabase(demoSide, { withFloor: true });
}
log('\n== large practice (desk and CSV)');
const large = await measureDatabase(largeSide, { withFloor: false });
const explains = await explainDesk(ownerUrl(LARGE_DB), large.deskSql, path.join(repoRoot, 'bench/results'));
delete large.deskSql;

writeResults(path.join(repoRoot, 'bench/results'), args.desk ? 'desk' : 'site-file', {
  at: new Date().toISOString(),
  settings: {
    seconds: SECONDS,
    repeats: REPEATS,
    connections: CONNECTIONS,
    patients: PATIENTS,
    apiNodeOptions: API_NODE_OPTIONS,
  },
  seeding: { demoSeconds: demoSeedS, large: largeSeed },
  demo,
  large,
  explains,
  totalSeconds: (performance.now() - started) / 1000,
});
