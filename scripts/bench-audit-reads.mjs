// What auditing costs a read (issue 11): GET /api/sites/:id as the dentist, 8 keep-alive
// connections for a fixed time, against the API's dist/ (or another build's, to compare:
// `node scripts/bench-audit-reads.mjs --dist /path/to/apps/api/dist`). Prints requests per second
// and latency percentiles, and how many audit rows the run wrote. Needs a prior `npm run build`.
import http from 'node:http';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { pathToFileURL } from 'node:url';
import { repoRoot } from './lib/config.mjs';
import { benchEnv, prepareDemoDatabase } from './lib/bench-databases.mjs';
import { startServices } from './services.mjs';

const { values } = parseArgs({
  options: {
    dist: { type: 'string', default: path.join(repoRoot, 'apps/api/dist') },
    seconds: { type: 'string', default: '10' },
    connections: { type: 'string', default: '8' },
  },
});
const DATABASE = 'torquetrail_bench_audit';
const load = (file) => import(pathToFileURL(path.join(values.dist, file)).href);

await startServices();
// The demo scenario as `npm start` seeds it, radiograph files included, through the current seed.
await prepareDemoDatabase(DATABASE);
const env = { ...benchEnv(DATABASE), NODE_ENV: 'test' };
Object.assign(process.env, env);

const { createPool } = await load('db/database.js');
const { createApp } = await load('app.js');
const { parseEnv } = await load('config/env.js');
const pool = createPool(env.DATABASE_URL);
const app = await createApp(parseEnv({ ...process.env, WEB_DIST: '' }), { logger: false });
await app.listen(0, '127.0.0.1');
const { port } = app.getHttpServer().address();

const agent = new http.Agent({ keepAlive: true, maxSockets: Number(values.connections) });
function request(method, url, { body, cookie } = {}) {
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        method,
        path: url,
        agent,
        headers: {
          ...(body ? { 'content-type': 'application/json', origin: `http://127.0.0.1:${port}` } : {}),
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
    req.end(body ? JSON.stringify(body) : undefined);
  });
}

const signIn = await request('POST', '/api/auth/sign-in', {
  body: { email: 'ines.calloway@larkspur.example', password: 'ledger-demo-2026' },
});
const cookie = String(signIn.headers['set-cookie']).split(';')[0];
const { rows: sites } = await pool.query(
  `select s.id from implant_sites s join patients p on p.id = s.patient_id where p.chart_number = 'LL-1001' and s.fdi = 35`,
);
const url = `/api/sites/${sites[0].id}`;
const countAudit = async () =>
  (await pool.query(`select count(*)::int as n from audit_events`).catch(() => ({ rows: [{ n: 0 }] }))).rows[0].n;

// Warm-up, then the measured run.
for (let i = 0; i < 200; i += 1) await request('GET', url, { cookie });
const auditBefore = await countAudit();
const latencies = [];
let failures = 0;
const end = Date.now() + Number(values.seconds) * 1000;
await Promise.all(
  Array.from({ length: Number(values.connections) }, async () => {
    while (Date.now() < end) {
      const t = process.hrtime.bigint();
      const res = await request('GET', url, { cookie });
      latencies.push(Number(process.hrtime.bigint() - t) / 1e6);
      if (res.status !== 200) failures += 1;
    }
  }),
);
latencies.sort((a, b) => a - b);
const pct = (p) => latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))].toFixed(2);
console.log(
  `[bench] GET /api/sites/:id, ${values.connections} connections, ${values.seconds} s (${values.dist}): ` +
    `${(latencies.length / Number(values.seconds)).toFixed(0)} req/s, p50 ${pct(50)} ms, p90 ${pct(90)} ms, ` +
    `p99 ${pct(99)} ms, ${failures} not 200, ${(await countAudit()) - auditBefore} audit rows written`,
);
agent.destroy();
await app.close();
await pool.end();
process.exit(0);
