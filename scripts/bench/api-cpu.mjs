// The API's CPU per request, A/B (issue 13, goal 1; bench/results/s10-api/README.md): up to three
// API processes (builds and/or Node options) on the demo database, loaded in turns with the same
// number of requests per run, the order of the variants reversed every other round, so each
// comparison is made within seconds whatever else the machine is doing. CPU per request (user +
// system from /proc, 10 ms ticks) and peak RSS per run; the replies are compared byte for byte.
// --profile writes a .cpuprofile per variant and endpoint (load window only) and prints where it goes.
// --database large loads the large practice of `node scripts/bench-site-file.mjs` (seeded by it, kept
// between runs) instead of the demo database: the Recall desk's endpoints (desk-*) need its 10 000 patients.
// Usage: node scripts/bench/api-cpu.mjs --variant 'name|apps/api/dist|--max-semi-space-size=1 …' …
//          [--endpoints site,timeline] [--requests 600] [--connections 8] [--rounds 3] [--profile] [--out dir]
//          [--database demo|large]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { API_NODE_OPTIONS, repoRoot } from '../lib/config.mjs';
import { benchEnv, prepareDemoDatabase, withOwner } from '../lib/bench-databases.mjs';
import { waitForPort } from '../lib/proc.mjs';
import { startServices } from '../services.mjs';
import { aggregate } from './cpu-profile-by-package.mjs';
import { aggregateHeap } from './heap-profile-by-package.mjs';

const { values: args } = parseArgs({
  options: {
    variant: { type: 'string', multiple: true },
    endpoints: { type: 'string', default: 'site,timeline,exams,radiographs' },
    requests: { type: 'string', default: '600' },
    connections: { type: 'string', default: '8' },
    rounds: { type: 'string', default: '3' },
    profile: { type: 'boolean', default: false },
    'profile-kind': { type: 'string', default: 'cpu' },
    reuse: { type: 'boolean', default: false },
    database: { type: 'string', default: 'demo' },
    out: { type: 'string', default: path.join(repoRoot, '.local', 'bench', 'api-cpu') },
  },
});
const DB = { demo: 'torquetrail_bench_demo', large: 'torquetrail_bench_large' }[args.database];
if (!DB) throw new Error(`--database demo or large, not ${args.database}`);
const HEAP = args['profile-kind'] === 'heap';
const EXT = HEAP ? 'heapprofile' : 'cpuprofile';
const BASE_PORT = 3000 + (Number(process.env.PORT ?? 3000) % 1000) + 1000;
const REQUESTS = Number(args.requests);
const CONNECTIONS = args.connections.split(',').map(Number);
const variants = (args.variant ?? [`current|apps/api/dist|${API_NODE_OPTIONS.join(' ')}`]).map((spec) => {
  const [name, dist, flags = ''] = spec.split('|');
  return { name, dist: path.resolve(repoRoot, dist), flags: flags.split(' ').filter(Boolean) };
});
if (variants.length > 3) throw new Error('at most three variants (ports PORT+1000..PORT+1002)');
fs.mkdirSync(args.out, { recursive: true });
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
/** User and system CPU the process has used, in ms (utime and stime of /proc/<pid>/stat, 10 ms ticks). */
const cpuOf = (pid) => {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return { user: (Number(fields[11]) * 1000) / 100, system: (Number(fields[12]) * 1000) / 100 };
};
const rssMb = (pid) => Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))[1]) / 1024;
const loadAverage = () => fs.readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');

await startServices();
const exists = await withOwner(
  'postgres',
  async (c) => (await c.query('select 1 from pg_database where datname = $1', [DB])).rowCount,
);
if (args.database === 'large' && !exists)
  throw new Error(`${DB} does not exist: seed it first with node scripts/bench-site-file.mjs --desk`);
if (args.database === 'demo' && (!args.reuse || !exists)) await prepareDemoDatabase(DB);

const target = await withOwner(DB, async (c) => {
  const r = await c.query(
    `select s.id as site, p.id as patient from implant_sites s join patients p on p.id = s.patient_id where p.chart_number = 'LL-1001' and s.fdi = 35`,
  );
  return r.rows[0];
});
const ENDPOINTS = {
  site: `/api/sites/${target.site}`,
  timeline: `/api/sites/${target.site}/timeline`,
  exams: `/api/recalls/sites/${target.site}/exams`,
  radiographs: `/api/patients/${target.patient}/radiographs`,
  // The pipeline's fixed cost, for comparison: the session's user only (and its audit row), and no session at all.
  me: '/api/auth/me',
  health: '/api/health/live',
  // The Recall desk's first pages, as the Site file benchmark measures them (--database large).
  'desk-due': '/api/recalls/desk?filter=all&sort=dueOn&dir=asc',
  'desk-name': '/api/recalls/desk?filter=all&sort=name&dir=asc',
  'desk-exam': '/api/recalls/desk?filter=all&sort=lastExamOn&dir=desc',
  'desk-overdue': '/api/recalls/desk?filter=overdue&sort=overdueDays&dir=desc',
  'desk-week': '/api/recalls/desk?filter=due-this-week&sort=dueOn&dir=asc',
  'desk-peri': '/api/recalls/desk?filter=peri-implantitis-last&sort=dueOn&dir=asc',
  'desk-search': '/api/recalls/desk?filter=all&sort=dueOn&dir=asc&search=family12',
};
const endpoints = args.endpoints.split(',').map((name) => [name, ENDPOINTS[name]]);

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

async function start(variant, port) {
  const env = {
    ...process.env,
    ...benchEnv(DB),
    NODE_ENV: 'production',
    APP_URL: `http://127.0.0.1:${port}`,
    COOKIE_SECURE: 'false',
    WEB_DIST: path.join(repoRoot, 'apps/web/dist'),
    PORT: String(port),
    TT_CPU_PROFILE: path.join(args.out, `${variant.name}.${EXT}`),
    TT_PROFILE_KIND: args['profile-kind'],
  };
  const preload = ['--import', path.join(repoRoot, 'scripts/bench/profile-on-signal.mjs')];
  const child = spawn(process.execPath, [...variant.flags, ...preload, path.join(variant.dist, 'main.js')], {
    cwd: repoRoot,
    env,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  await waitForPort(port, { timeoutMs: 60_000, label: variant.name });
  const signIn = await request(port, '/api/auth/sign-in', {
    method: 'POST',
    body: { email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' },
  });
  if (signIn.status !== 200 && signIn.status !== 201)
    throw new Error(`${variant.name}: sign-in answered ${signIn.status}`);
  return { ...variant, port, child, cookie: String(signIn.headers.get('set-cookie')).split(';')[0], runs: [] };
}

function load(side, url, connections, amount = REQUESTS) {
  return new Promise((resolve, reject) => {
    let firstError = null;
    const instance = autocannon(
      { url: `http://127.0.0.1:${side.port}${url}`, connections, amount, headers: { cookie: side.cookie } },
      (error, result) => (error ? reject(error) : resolve({ ...result, firstError })),
    );
    instance.on('reqError', (error) => (firstError ??= error.message));
  });
}

async function measure(side, name, url, connections) {
  let peak = rssMb(side.child.pid);
  const sampler = setInterval(() => (peak = Math.max(peak, rssMb(side.child.pid))), 100);
  const cpu = cpuOf(side.child.pid);
  const result = await load(side, url, connections);
  const after = cpuOf(side.child.pid);
  clearInterval(sampler);
  const bad = result.errors + result.timeouts + result.non2xx;
  const run = {
    endpoint: name,
    connections,
    requests: result.requests.total,
    cpuMsPerRequest: (after.user + after.system - cpu.user - cpu.system) / result.requests.total,
    systemMsPerRequest: (after.system - cpu.system) / result.requests.total,
    rps: result.requests.average,
    p50: result.latency.p50,
    peakRssMb: Math.max(peak, rssMb(side.child.pid)),
    errors: bad,
    load: loadAverage(),
  };
  side.runs.push(run);
  return run;
}

const sides = [];
for (const [i, variant] of variants.entries()) sides.push(await start(variant, BASE_PORT + i));
const stopAll = () =>
  Promise.all(
    sides.map(
      (s) =>
        new Promise((resolve) => {
          if (s.child.exitCode !== null) return resolve();
          s.child.once('exit', resolve);
          s.child.kill('SIGTERM');
        }),
    ),
  );
try {
  console.log(`load average at start: ${loadAverage()}`);
  // The same bytes from every variant, or the comparison is not of the same work.
  const same = {};
  for (const [name, url] of endpoints) {
    const bodies = await Promise.all(sides.map((s) => request(s.port, url, { cookie: s.cookie })));
    if (bodies.some((b) => b.status !== 200)) throw new Error(`${name}: ${bodies.map((b) => b.status).join('/')}`);
    same[name] = bodies.every((b) => b.body.equals(bodies[0].body));
    console.log(`${name}: ${bodies[0].body.length} bytes, identical across variants: ${same[name]}`);
  }
  for (const side of sides) for (const [, url] of endpoints) await load(side, url, 8, 300);

  if (args.profile) {
    for (const [name, url] of endpoints) {
      for (const side of sides) {
        const file = path.join(args.out, `${side.name}-${name}.${EXT}`);
        const written = path.join(args.out, `${side.name}.${EXT}`);
        fs.rmSync(written, { force: true });
        side.child.kill('SIGWINCH');
        await new Promise((r) => setTimeout(r, 300));
        const result = await load(side, url, CONNECTIONS[0]);
        side.child.kill('SIGWINCH');
        if (result.errors + result.timeouts + result.non2xx > 0 || result.requests.total === 0)
          throw new Error(
            `${side.name} ${name}: ${JSON.stringify({ errors: result.errors, timeouts: result.timeouts, non2xx: result.non2xx, first: result.firstError, total: result.requests.total })}`,
          );
        for (let i = 0; i < 100 && !fs.existsSync(written); i += 1) await new Promise((r) => setTimeout(r, 100));
        await new Promise((r) => setTimeout(r, 300));
        fs.renameSync(written, file);
        if (HEAP) {
          const h = aggregateHeap(JSON.parse(fs.readFileSync(file, 'utf8')));
          const kb = (bytes) => (bytes / 1024 / result.requests.total).toFixed(1);
          console.log(
            `\n== ${side.name}, ${name}: ${result.requests.total} requests, ${kb(h.totalBytes)} KB allocated a request`,
          );
          console.log(
            'KB/request: ' +
              h.packages
                .slice(0, 14)
                .map(([k, b]) => `${k} ${kb(b)}`)
                .join(', '),
          );
          console.log(
            `  (node scripts/bench/heap-profile-by-package.mjs ${path.relative(repoRoot, file)} --requests ${result.requests.total})`,
          );
          continue;
        }
        const a = aggregate(JSON.parse(fs.readFileSync(file, 'utf8')));
        const perRequest = (ms) => ((ms * 1000) / result.requests.total).toFixed(0);
        console.log(
          `\n== ${side.name}, ${name}: ${result.requests.total} requests, ${a.totalMs.toFixed(0)} ms sampled, ${(a.totalMs / result.requests.total).toFixed(2)} ms/request`,
        );
        console.log(
          'self µs/request: ' +
            a.self
              .slice(0, 14)
              .map(([k, ms]) => `${k} ${perRequest(ms)}`)
              .join(', '),
        );
        console.log(
          'inclusive µs/request: ' +
            a.inclusive
              .slice(0, 14)
              .map(([k, ms]) => `${k} ${perRequest(ms)}`)
              .join(', '),
        );
        console.log(
          `  (node scripts/bench/cpu-profile-by-package.mjs ${path.relative(repoRoot, file)} --requests ${result.requests.total})`,
        );
      }
    }
  }

  for (let round = 0; round < Number(args.rounds); round += 1) {
    const order = round % 2 === 0 ? sides : [...sides].reverse();
    for (const connections of CONNECTIONS) {
      for (const [name, url] of endpoints) {
        const line = [];
        for (const side of order) {
          const run = await measure(side, name, url, connections);
          line.push(
            `${side.name} ${run.cpuMsPerRequest.toFixed(2)} ms/req (sys ${run.systemMsPerRequest.toFixed(2)}) ${run.rps.toFixed(0)} req/s p50 ${run.p50} ms RSS ${run.peakRssMb.toFixed(0)} MB${run.errors ? ` ERRORS ${run.errors}` : ''}`,
          );
        }
        console.log(`#${round + 1} ${name} ${connections}c (load ${loadAverage()}): ${line.join(' | ')}`);
      }
    }
  }
  const summary = {};
  for (const side of sides) {
    summary[side.name] = {};
    for (const connections of CONNECTIONS)
      for (const [name] of endpoints) {
        const runs = side.runs.filter((r) => r.endpoint === name && r.connections === connections);
        if (runs.length === 0) continue;
        summary[side.name][`${name} ${connections}c`] = {
          cpuMsPerRequest: runs.map((r) => Number(r.cpuMsPerRequest.toFixed(2))),
          median: Number(median(runs.map((r) => r.cpuMsPerRequest)).toFixed(2)),
          systemMedian: Number(median(runs.map((r) => r.systemMsPerRequest)).toFixed(2)),
          // Wall time: at 1 connection, the time a person waits for the reply.
          p50Median: median(runs.map((r) => r.p50)),
          peakRssMb: Number(Math.max(...runs.map((r) => r.peakRssMb)).toFixed(0)),
        };
      }
  }
  console.log('\nmedian CPU ms/request (runs) and peak RSS:');
  for (const [name, rows] of Object.entries(summary))
    for (const [row, s] of Object.entries(rows))
      console.log(
        `  ${name.padEnd(12)} ${row.padEnd(18)} ${s.median.toFixed(2)} (${s.cpuMsPerRequest.join(', ')}; system ${s.systemMedian.toFixed(2)}) p50 ${s.p50Median} ms peak ${s.peakRssMb} MB`,
      );
  fs.writeFileSync(
    path.join(args.out, 'api-cpu.json'),
    JSON.stringify(
      {
        at: new Date().toISOString(),
        settings: { requests: REQUESTS, connections: CONNECTIONS, rounds: Number(args.rounds) },
        variants: variants.map(({ name, dist, flags }) => ({ name, dist: path.relative(repoRoot, dist), flags })),
        sameReplies: same,
        summary,
        runs: Object.fromEntries(sides.map((s) => [s.name, s.runs])),
      },
      null,
      1,
    ),
  );
} finally {
  await stopAll();
}
