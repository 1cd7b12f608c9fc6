// The floor of the Site-file benchmark (docs/performance.md): a bare node:http server with one `pg`
// pool that, for each measured URL, runs the SQL the API itself ran for it (captured from the API
// by scripts/bench/capture-sql.mjs) as named statements, in the same round trips (statements the
// API ran at the same time run at the same time here), and answers the API's own reply bytes.
// What is left between the two is everything the API does around its SQL: framework, guards,
// query building, JSON shaping. Started by scripts/bench-site-file.mjs; not a product server.
// Usage: node scripts/bench-floor.mjs <replay.json> (PORT, DATABASE_URL and PG_OPTIONS from the environment)
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import pgModule from 'pg';

const replay = JSON.parse(fs.readFileSync(process.argv[2], 'utf8'));
const pool = new pgModule.Pool({
  connectionString: process.env.DATABASE_URL,
  max: 10,
  ...(process.env.PG_OPTIONS ? { options: process.env.PG_OPTIONS } : {}),
});
const named = (text) => `floor_${createHash('sha1').update(text).digest('hex').slice(0, 16)}`;
const routes = new Map(
  Object.entries(replay.routes).map(([url, route]) => [
    url,
    {
      ...route,
      body: Buffer.from(route.body),
      groups: route.groups.map((group) => group.map((s) => ({ name: named(s.text), text: s.text, values: s.values }))),
    },
  ]),
);

async function answer(req, res) {
  const route = routes.get(req.url ?? '');
  if (!route) {
    res.writeHead(404).end();
    return;
  }
  try {
    for (const group of route.groups) await Promise.all(group.map((statement) => pool.query(statement)));
    res.writeHead(route.status, { 'content-type': route.contentType, 'content-length': route.body.length });
    res.end(route.body);
  } catch (error) {
    res.writeHead(500, { 'content-type': 'text/plain' }).end(String(error));
  }
}

const server = http.createServer((req, res) => void answer(req, res));
server.keepAliveTimeout = 60_000;
server.listen(Number(process.env.PORT), '127.0.0.1', () => process.send?.('ready'));
process.on('SIGTERM', () => {
  server.close();
  void pool.end();
});
