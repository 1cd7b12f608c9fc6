// The web's first load alone (issue 13, goal 3; docs/performance.md): the Arch of Harold Whitcombe
// served by the API from a build, cold, in headless Chromium, against a blank page of the same
// build. The Site-file benchmark measures the same as part of its run; this one takes a minute and
// can measure any build (`--web-dist`, e.g. an older commit's apps/web/dist) on the demo database.
// Measures only: nothing is asserted. Needs `npm run build` (the API's dist/).
// Usage: node scripts/bench-web.mjs [--runs 5] [--web-dist apps/web/dist] [--out bench/results/web-first-load.json]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
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
    'web-dist': { type: 'string', default: 'apps/web/dist' },
    out: { type: 'string', default: 'bench/results/web-first-load.json' },
  },
});
const DEMO_DB = 'torquetrail_bench_demo';
const API_PORT = 3000 + (Number(process.env.PORT ?? 3000) % 1000) + 1000;
const webDist = path.resolve(repoRoot, args['web-dist']);

await startServices();
await prepareDemoDatabase(DEMO_DB);
const api = spawn(process.execPath, [...API_NODE_OPTIONS, 'apps/api/dist/main.js'], {
  cwd: repoRoot,
  env: {
    ...process.env,
    ...benchEnv(DEMO_DB),
    NODE_ENV: 'production',
    APP_URL: `http://127.0.0.1:${API_PORT}`,
    COOKIE_SECURE: 'false',
    WEB_DIST: webDist,
    PORT: String(API_PORT),
  },
  stdio: ['ignore', 'ignore', 'inherit'],
});
try {
  await waitForPort(API_PORT, { timeoutMs: 120_000, label: 'api' });
  const base = `http://127.0.0.1:${API_PORT}`;
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base },
    body: JSON.stringify({ email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' }),
  });
  if (!signIn.ok) throw new Error(`sign-in answered ${signIn.status}`);
  const cookie = String(signIn.headers.get('set-cookie')).split(';')[0];
  const client = new pgModule.Client({ connectionString: ownerUrl(DEMO_DB) });
  await client.connect();
  const found = await client.query(`select id from patients where chart_number = 'LL-1001'`);
  await client.end();
  const patientId = found.rows[0]?.id;
  if (!patientId) throw new Error('no demo patient LL-1001');
  const web = await measureWebFirstLoad({ baseUrl: base, cookie, patientId, webDist, runs: Number(args.runs) });
  const out = { at: new Date().toISOString(), webDist: path.relative(repoRoot, webDist), ...web };
  fs.mkdirSync(path.dirname(path.resolve(repoRoot, args.out)), { recursive: true });
  fs.writeFileSync(path.resolve(repoRoot, args.out), `${JSON.stringify(out, null, 1)}\n`);
  console.log(
    `Arch ${web.archMs} ms, blank ${web.blankMs} ms, ratio ${web.ratio.toFixed(2)}; ` +
      `JS before the Arch ${web.jsGzipKb.toFixed(1)} KB gzip in ${web.scripts} files (median of ${web.runs})`,
  );
  for (const [file, kb] of Object.entries(web.scriptKb).sort((a, b) => b[1] - a[1])) console.log(`  ${kb} KB ${file}`);
} finally {
  api.kill('SIGTERM');
}
