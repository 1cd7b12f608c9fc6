// The Recall desk's CSV export and first pages, two builds of the API side by side on the large
// practice of the Site-file benchmark (run `node scripts/bench-site-file.mjs --desk` once first, it
// seeds `torquetrail_bench_large`). Each build's API runs at the same time on its own port; the
// builds take turns, `--rounds` times, so the machine's load falls on both alike. Per build: the
// export's time over HTTP, the API process's CPU per export (user + system, /proc/<pid>/stat), its
// resident memory before and at its peak (sampled every 20 ms), each desk filter's first page (time
// and API CPU per request), and whether every compared reply is the same bytes in both builds.
// Measures only: nothing is asserted.
// Usage: node scripts/bench-desk-csv-ab.mjs --old <dir holding the old apps/api/dist> [--rounds 3]
//        [--exports 6] [--pages 12] [--out bench/results/s10-desk/ab.json]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { API_NODE_OPTIONS, repoRoot } from './lib/config.mjs';
import { benchEnv } from './lib/bench-databases.mjs';
import { waitForPort } from './lib/proc.mjs';
import { startServices } from './services.mjs';

const { values: args } = parseArgs({
  options: {
    old: { type: 'string' },
    rounds: { type: 'string', default: '3' },
    exports: { type: 'string', default: '6' },
    pages: { type: 'string', default: '12' },
    out: { type: 'string', default: path.join(repoRoot, 'bench/results/s10-desk/ab.json') },
  },
});
if (!args.old) throw new Error('--old <dir> names the old build (a copy of apps/api/dist)');
const ROUNDS = Number(args.rounds);
const EXPORTS = Number(args.exports);
const PAGES = Number(args.pages);
const DATABASE = 'torquetrail_bench_large';
const BASE_PORT = 3000 + (Number(process.env.PORT ?? 3000) % 1000) + 1000;
const BUILDS = [
  { name: 'old', main: path.resolve(args.old, 'main.js'), port: BASE_PORT },
  { name: 'new', main: path.join(repoRoot, 'apps/api/dist/main.js'), port: BASE_PORT + 1 },
];
const CSV_URL = '/api/recalls/desk/csv?filter=all&sort=dueOn&dir=asc';
const PAGES_MEASURED = [
  ['all, by due date', '/api/recalls/desk?filter=all&sort=dueOn&dir=asc'],
  ['all, by name', '/api/recalls/desk?filter=all&sort=name&dir=asc'],
  ['all, by last exam', '/api/recalls/desk?filter=all&sort=lastExamOn&dir=desc'],
  ['overdue', '/api/recalls/desk?filter=overdue&sort=overdueDays&dir=desc'],
  ['due this week', '/api/recalls/desk?filter=due-this-week&sort=dueOn&dir=asc'],
  ['peri-implantitis last time', '/api/recalls/desk?filter=peri-implantitis-last&sort=dueOn&dir=asc'],
  ['search', '/api/recalls/desk?filter=all&sort=dueOn&dir=asc&search=family12'],
];
// Every filter and order of the export, archived patients, a search: both builds must write the same bytes.
const COMPARED = [
  CSV_URL,
  '/api/recalls/desk/csv?filter=all&sort=dueOn&dir=desc',
  '/api/recalls/desk/csv?filter=all&sort=name&dir=desc',
  '/api/recalls/desk/csv?filter=all&sort=lastExamOn&dir=asc',
  '/api/recalls/desk/csv?filter=all&sort=overdueDays&dir=asc',
  '/api/recalls/desk/csv?filter=all&sort=overdueDays&dir=desc',
  '/api/recalls/desk/csv?filter=overdue&sort=overdueDays&dir=desc',
  '/api/recalls/desk/csv?filter=due-this-week&sort=dueOn&dir=asc',
  '/api/recalls/desk/csv?filter=peri-implantitis-last&sort=lastExamOn&dir=desc',
  '/api/recalls/desk/csv?filter=provisional-overdue&sort=name&dir=asc',
  '/api/recalls/desk/csv?filter=insert-review-overdue&sort=name&dir=asc',
  '/api/recalls/desk/csv?filter=all&sort=name&dir=asc&archived=archived',
  '/api/recalls/desk/csv?filter=all&sort=name&dir=asc&archived=all',
  '/api/recalls/desk/csv?filter=all&sort=dueOn&dir=asc&search=family12',
  ...PAGES_MEASURED.map(([, url]) => url),
];

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
const cpuMs = (pid) => {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
};
const rssMb = (pid) => Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))[1]) / 1024;

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

async function start(build) {
  const env = {
    ...process.env,
    ...benchEnv(DATABASE),
    NODE_ENV: 'production',
    APP_URL: `http://127.0.0.1:${build.port}`,
    COOKIE_SECURE: 'false',
    WEB_DIST: path.join(repoRoot, 'apps/web/dist'),
    PORT: String(build.port),
  };
  const child = spawn(process.execPath, [...API_NODE_OPTIONS, build.main], {
    cwd: repoRoot,
    env,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  await waitForPort(build.port, { timeoutMs: 60_000, label: build.name });
  const signIn = await request(build.port, '/api/auth/sign-in', {
    method: 'POST',
    body: { email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' },
  });
  if (signIn.status !== 200 && signIn.status !== 201)
    throw new Error(`${build.name}: sign-in answered ${signIn.status}`);
  return { ...build, child, cookie: String(signIn.headers.get('set-cookie')).split(';')[0] };
}

/** One turn of a build: EXPORTS exports (the first a warm-up) and PAGES first pages of each filter (3 warm-ups). */
async function turn(api) {
  const csv = { ms: [], cpuMs: [], bytes: 0, rssBeforeMb: rssMb(api.child.pid), rssPeakMb: 0 };
  for (let i = 0; i < EXPORTS; i += 1) {
    const sampler = setInterval(() => (csv.rssPeakMb = Math.max(csv.rssPeakMb, rssMb(api.child.pid))), 20);
    const cpu = cpuMs(api.child.pid);
    const t = performance.now();
    const r = await request(api.port, CSV_URL, { cookie: api.cookie });
    const ms = performance.now() - t;
    const used = cpuMs(api.child.pid) - cpu;
    clearInterval(sampler);
    if (r.status !== 200) throw new Error(`${api.name}: export answered ${r.status}`);
    csv.bytes = r.body.length;
    if (i > 0) {
      csv.ms.push(ms);
      csv.cpuMs.push(used);
    }
  }
  const pages = {};
  for (const [name, url] of PAGES_MEASURED) {
    const times = [];
    const cpu = [];
    for (let i = 0; i < PAGES + 3; i += 1) {
      const before = cpuMs(api.child.pid);
      const t = performance.now();
      const r = await request(api.port, url, { cookie: api.cookie });
      if (r.status !== 200) throw new Error(`${api.name}: ${name} answered ${r.status}`);
      if (i >= 3) {
        times.push(performance.now() - t);
        cpu.push(cpuMs(api.child.pid) - before);
      }
    }
    // CPU per request over the turn's requests (a single one is below the 10 ms tick).
    pages[name] = { medianMs: median(times), cpuMsPerRequest: cpu.reduce((a, b) => a + b, 0) / cpu.length };
  }
  return { loadAverage: os.loadavg()[0], csv, pages };
}

await startServices();
const apis = [];
try {
  for (const build of BUILDS) apis.push(await start(build));
  const same = {};
  for (const url of COMPARED) {
    const [a, b] = await Promise.all(apis.map((api) => request(api.port, url, { cookie: api.cookie })));
    same[url] = {
      status: [a.status, b.status],
      bytes: [a.body.length, b.body.length],
      identical: a.status === b.status && a.body.equals(b.body),
      headers: ['content-type', 'content-disposition', 'cache-control'].every(
        (h) => a.headers.get(h) === b.headers.get(h),
      ),
    };
    console.log(`${same[url].identical && same[url].headers ? 'same' : 'DIFFERENT'} ${url} (${a.body.length} B)`);
  }
  const runs = { old: [], new: [] };
  for (let round = 0; round < ROUNDS; round += 1) {
    for (const api of round % 2 === 0 ? apis : [...apis].reverse()) {
      const r = await turn(api);
      runs[api.name].push(r);
      console.log(
        `round ${round + 1} ${api.name}: CSV median ${median(r.csv.ms).toFixed(0)} ms, CPU ${median(r.csv.cpuMs)} ms, ` +
          `RSS ${r.csv.rssBeforeMb.toFixed(0)} → ${r.csv.rssPeakMb.toFixed(0)} MB; pages ` +
          Object.entries(r.pages)
            .map(([name, p]) => `${name} ${p.medianMs.toFixed(1)} ms/${p.cpuMsPerRequest.toFixed(1)} cpu`)
            .join(', ') +
          ` (load ${r.loadAverage.toFixed(1)})`,
      );
    }
  }
  fs.mkdirSync(path.dirname(args.out), { recursive: true });
  fs.writeFileSync(
    args.out,
    `${JSON.stringify({ at: new Date().toISOString(), uptime: os.loadavg(), same, runs }, null, 2)}\n`,
  );
  console.log(`written ${path.relative(repoRoot, args.out)}`);
} finally {
  for (const api of apis) {
    api.child.kill('SIGTERM');
  }
}
