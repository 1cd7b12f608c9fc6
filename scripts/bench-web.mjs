// The web's first load alone (issue 13, goal 3; docs/performance.md): the Arch of Harold Whitcombe
// served by the API from a build, cold, in headless Chromium, against a blank page of the same
// build. The Site-file benchmark measures the same as part of its run; this one takes a minute a
// build and can measure several builds side by side (`--web-dist` again for each, e.g. an older
// commit's apps/web/dist), each served by its own API (the page's CSP names the inline script of
// the index.html that API serves), in `--rounds` rounds that alternate the builds, so a change in
// the machine's load falls on all of them. Measures only: nothing is asserted. Needs `npm run build`.
// Usage: node scripts/bench-web.mjs [--runs 5] [--rounds 1] [--web-dist apps/web/dist …] [--out bench/results/web-first-load.json]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import pgModule from 'pg';
import { API_NODE_OPTIONS, repoRoot } from './lib/config.mjs';
import { benchEnv, ownerUrl, prepareDemoDatabase } from './lib/bench-databases.mjs';
import { waitForPort } from './lib/proc.mjs';
import { startServices } from './services.mjs';
import { measureWebFirstLoad } from './bench/web-first-load.mjs';

const { values: args } = parseArgs({
  options: {
    runs: { type: 'string', default: '5' },
    rounds: { type: 'string', default: '1' },
    'web-dist': { type: 'string', multiple: true },
    out: { type: 'string', default: 'bench/results/web-first-load.json' },
  },
});
const DEMO_DB = 'torquetrail_bench_demo';
const FIRST_PORT = 3000 + (Number(process.env.PORT ?? 3000) % 1000) + 1000;
const webDists = (args['web-dist'] ?? ['apps/web/dist']).map((dir) => path.resolve(repoRoot, dir));
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];

/** Starts the API (as `npm start` runs it) serving one build, on its own port. */
async function startApi(webDist, port) {
  const api = spawn(process.execPath, [...API_NODE_OPTIONS, 'apps/api/dist/main.js'], {
    cwd: repoRoot,
    env: {
      ...process.env,
      ...benchEnv(DEMO_DB),
      NODE_ENV: 'production',
      APP_URL: `http://127.0.0.1:${port}`,
      COOKIE_SECURE: 'false',
      WEB_DIST: webDist,
      PORT: String(port),
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  await waitForPort(port, { timeoutMs: 120_000, label: 'api' });
  return api;
}

async function signIn(base) {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base },
    body: JSON.stringify({ email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' }),
  });
  if (!res.ok) throw new Error(`sign-in answered ${res.status}`);
  return String(res.headers.get('set-cookie')).split(';')[0];
}

await startServices();
await prepareDemoDatabase(DEMO_DB);
const client = new pgModule.Client({ connectionString: ownerUrl(DEMO_DB) });
await client.connect();
const found = await client.query(`select id from patients where chart_number = 'LL-1001'`);
await client.end();
const patientId = found.rows[0]?.id;
if (!patientId) throw new Error('no demo patient LL-1001');

const apis = [];
try {
  const builds = [];
  for (const [i, webDist] of webDists.entries()) {
    const port = FIRST_PORT + 10 + i;
    apis.push(await startApi(webDist, port));
    const base = `http://127.0.0.1:${port}`;
    builds.push({ webDist, base, cookie: await signIn(base), rounds: [] });
  }
  const loadAverages = [os.loadavg()[0]];
  for (let round = 0; round < Number(args.rounds); round += 1) {
    for (const build of builds) {
      const { base: baseUrl, cookie, webDist } = build;
      build.rounds.push(await measureWebFirstLoad({ baseUrl, cookie, patientId, webDist, runs: Number(args.runs) }));
      loadAverages.push(os.loadavg()[0]);
    }
  }
  const results = builds.map(({ webDist, rounds }) => {
    const last = rounds.at(-1);
    return {
      webDist: path.relative(repoRoot, webDist) || webDist,
      ...last,
      // Across rounds: the median of each round's medians, and each round's own figures.
      archMs: median(rounds.map((r) => r.archMs)),
      blankMs: median(rounds.map((r) => r.blankMs)),
      ratio: median(rounds.map((r) => r.ratio)),
      rounds: rounds.map(
        ({ archMs, blankMs, ratio, jsGzipKb, meStartMs, patientStartMs, archShownMs, scriptsDoneMs, dataDoneMs }) => ({
          archMs,
          blankMs,
          ratio,
          jsGzipKb,
          meStartMs,
          patientStartMs,
          archShownMs,
          scriptsDoneMs,
          dataDoneMs,
        }),
      ),
    };
  });
  const out = {
    at: new Date().toISOString(),
    cpus: os.cpus().length,
    loadAverage1m: { min: Math.min(...loadAverages), max: Math.max(...loadAverages) },
    // One build: its figures at the top level, as before; several: one entry each.
    ...(results.length === 1 ? results[0] : { builds: results }),
  };
  fs.mkdirSync(path.dirname(path.resolve(repoRoot, args.out)), { recursive: true });
  fs.writeFileSync(path.resolve(repoRoot, args.out), `${JSON.stringify(out, null, 1)}\n`);
  console.log(
    `load average (1 min) ${out.loadAverage1m.min.toFixed(1)}–${out.loadAverage1m.max.toFixed(1)} on ${out.cpus} CPUs`,
  );
  for (const web of results) {
    console.log(
      `${web.webDist}: Arch ${web.archMs} ms, blank ${web.blankMs} ms, ratio ${web.ratio.toFixed(2)} ` +
        `(rounds: ${web.rounds.map((r) => r.ratio.toFixed(2)).join(', ')}); ` +
        `JS before the Arch ${web.jsGzipKb.toFixed(1)} KB gzip in ${web.scripts} files, ` +
        `CSS ${web.cssGzipKb.toFixed(1)} KB gzip, fonts ${web.fontKb.toFixed(1)} KB in ${web.fonts} files ` +
        `(median of ${web.runs} a round)`,
    );
    console.log(
      `  in the page: scripts received by ${Math.round(web.scriptsDoneMs)} ms, the first reads by ` +
        `${Math.round(web.dataDoneMs)} ms, the Arch in the document at ${Math.round(web.archShownMs)} ms`,
    );
    for (const [file, kb] of Object.entries(web.scriptKb).sort((a, b) => b[1] - a[1]))
      console.log(`  ${kb} KB ${file}`);
  }
} finally {
  for (const api of apis) api.kill('SIGTERM');
}
