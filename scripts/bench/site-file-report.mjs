// The Site-file benchmark's outputs: the desk's EXPLAIN files, the figures reduced to medians and
// ratios, bench/results/site-file.json and .md, and the table printed at the end.
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pgModule from 'pg';
import { repoRoot } from '../lib/config.mjs';
import { sharedBuffersOf } from './plan-buffers.mjs';

const database = await import(pathToFileURL(path.join(repoRoot, 'apps/api/dist/db/database.js')).href);
/** The session settings of the API's pool (the floor and the EXPLAIN sessions use the same). */
export const API_PG_OPTIONS = database.PG_SESSION_OPTIONS ?? '';

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
const slug = (name) => name.replace(/[^a-z0-9]+/gi, '-').toLowerCase();

/** EXPLAIN (ANALYZE, BUFFERS) of each desk statement as the API ran it, one file per filter. */
export async function explainDesk(connectionString, deskSql, dir) {
  fs.mkdirSync(dir, { recursive: true });
  const client = new pgModule.Client({ connectionString, ...(API_PG_OPTIONS ? { options: API_PG_OPTIONS } : {}) });
  await client.connect();
  const out = {};
  try {
    for (const [name, statements] of Object.entries(deskSql)) {
      const parts = [];
      for (const s of statements) {
        // The export ran as a cursor before session 10, which PostgreSQL plans for its first rows
        // (cursor_tuple_fraction): explained as the cursor it was, read to its end. Since session 10
        // it is the query of a COPY, planned as a plain statement.
        const cursor = s.asCursor === true;
        if (cursor) await client.query('begin read only');
        const plan = await client.query({
          text: `explain (analyze, buffers) ${cursor ? 'declare batch_rows no scroll cursor for ' : ''}${s.text}`,
          values: s.values,
        });
        if (cursor) await client.query('rollback');
        parts.push(
          `-- ${s.text}\n-- values: ${JSON.stringify(s.values)}\n${plan.rows.map((r) => r['QUERY PLAN']).join('\n')}`,
        );
      }
      const text = parts.join('\n\n');
      const file = `explain-desk-${slug(name)}.txt`;
      fs.writeFileSync(path.join(dir, file), `${text}\n`);
      out[name] = {
        file,
        statements: statements.length,
        scansAllExams: /Seq Scan on recall_exams/.test(text),
        sharedBuffers: sharedBuffersOf(text),
        executionMs: [...text.matchAll(/Execution Time: ([\d.]+) ms/g)].reduce((sum, m) => sum + Number(m[1]), 0),
      };
    }
  } finally {
    await client.end();
  }
  return out;
}

/** Medians over the repeats, per endpoint and connection count. */
function reduce(measured) {
  const rows = {};
  for (const [name, e] of Object.entries(measured.endpoints)) {
    rows[name] = { statements: e.statements, roundTrips: e.roundTrips, sameBytes: e.sameBytes, byConnections: {} };
    for (const connections of new Set(e.runs.map((r) => r.connections))) {
      const runs = e.runs.filter((r) => r.connections === connections);
      const side = (key) =>
        runs[0][key]
          ? {
              rps: median(runs.map((r) => r[key].rps)),
              p50: median(runs.map((r) => r[key].p50)),
              p95: median(runs.map((r) => r[key].p95)),
              cpuMsPerRequest: median(runs.map((r) => r[key].cpuMsPerRequest ?? Infinity)),
              errors: runs.reduce((n, r) => n + r[key].errors, 0),
            }
          : null;
      rows[name].byConnections[connections] = { api: side('api'), floor: side('floor') };
    }
  }
  return rows;
}

/** `file`.json and `file`.md; without a demo run (--desk), only the Recall desk's part. */
export function writeResults(dir, file, raw) {
  const demo = raw.demo ? reduce(raw.demo) : {};
  const large = reduce(raw.large);
  const table = [];
  for (const [name, d] of Object.entries(demo)) {
    for (const [c, { api, floor }] of Object.entries(d.byConnections)) {
      const l = large[name].byConnections[c].api;
      table.push({
        endpoint: name,
        connections: Number(c),
        statements: d.statements,
        roundTrips: d.roundTrips,
        api,
        floor,
        floorOverApiRps: floor.rps / api.rps,
        apiOverFloorCpu: api.cpuMsPerRequest / floor.cpuMsPerRequest,
        p50OverFloor: api.p50 / floor.p50,
        large: l,
        demoOverLargeRps: api.rps / l.rps,
        largeOverDemoP50: l.p50 / api.p50,
      });
    }
  }
  const results = { ...raw, table, peakRssMb: Math.max(raw.demo?.peakRssMb ?? 0, raw.large.peakRssMb) };
  fs.mkdirSync(dir, { recursive: true });
  fs.writeFileSync(path.join(dir, `${file}.json`), `${JSON.stringify(results, null, 2)}\n`);
  const md = markdown(results);
  fs.writeFileSync(path.join(dir, `${file}.md`), md);
  console.log(`\n${md}`);
  return results;
}

const f = (n, digits = 1) => (n === null || n === undefined ? '—' : n.toFixed(digits));

function markdown(r) {
  if (!r.demo) return deskMarkdown(r);
  const lines = [
    `# Site file benchmark — ${r.at}`,
    '',
    `Medians of ${r.settings.repeats} alternating runs of ${r.settings.seconds} s (autocannon); p50/p95 in ms.`,
    ...(r.settings.apiNodeOptions
      ? [`The APIs run with \`${r.settings.apiNodeOptions.join(' ')}\` (scripts/lib/config.mjs).`]
      : []),
    `Floor: the API's own SQL replayed as named statements in the same round trips by a bare node:http + pg server (docs/performance.md).`,
    '',
    '| endpoint | conns | SQL / round trips | API req/s | floor req/s | floor÷API | API p50 | floor p50 | p50 ÷ floor | API p95 | large req/s | large p50 | demo÷large req/s | large÷demo p50 |',
    '|---|---|---|---|---|---|---|---|---|---|---|---|---|---|',
  ];
  for (const t of r.table) {
    lines.push(
      `| ${t.endpoint} | ${t.connections} | ${t.statements} / ${t.roundTrips} | ${f(t.api.rps, 0)} | ${f(t.floor.rps, 0)} | ${f(t.floorOverApiRps, 2)} | ${f(t.api.p50)} | ${f(t.floor.p50)} | ${f(t.p50OverFloor, 2)} | ${f(t.api.p95)} | ${f(t.large.rps, 0)} | ${f(t.large.p50)} | ${f(t.demoOverLargeRps, 2)} | ${f(t.largeOverDemoP50, 2)} |`,
    );
  }
  lines.push(
    '',
    "Server CPU per request (user + system of the process over the run ÷ requests answered; ms; the machine's load changes it far less than the wall-clock figures):",
    '',
    '| endpoint | conns | API CPU/req | floor CPU/req | API ÷ floor | large API CPU/req |',
    '|---|---|---|---|---|---|',
  );
  for (const t of r.table) {
    lines.push(
      `| ${t.endpoint} | ${t.connections} | ${f(t.api.cpuMsPerRequest, 2)} | ${f(t.floor.cpuMsPerRequest, 2)} | ${f(t.apiOverFloorCpu, 2)} | ${f(t.large.cpuMsPerRequest, 2)} |`,
    );
  }
  const failed = r.table.flatMap((t) =>
    [
      ['API', t.api],
      ['floor', t.floor],
      ['large', t.large],
    ]
      .filter(([, side]) => side?.errors)
      .map(([who, side]) => `${t.endpoint} ${t.connections}c ${who}: ${side.errors}`),
  );
  if (failed.length)
    lines.push(
      '',
      `**Runs with errors, timeouts or non-2xx answers** (their figures are not valid): ${failed.join('; ')}.`,
    );
  lines.push('', `API peak RSS under load: ${f(r.peakRssMb, 0)} MB.`, '');
  lines.push(...deskTable(r));
  const w = r.demo.web;
  if (w) {
    lines.push(
      '',
      `## Web, first load of the Arch (demo database, headless Chromium, median of ${w.runs} cold loads)`,
      '',
      `Arch visible ${f(w.archMs, 0)} ms; blank page of the same build (JavaScript off) ${f(w.blankMs, 0)} ms: ratio ${f(w.ratio, 2)}.`,
      `JavaScript before the Arch shows: ${w.scripts} files, ${f(w.jsGzipKb)} KB gzip.`,
      `\`/api/auth/me\` starts at ${f(w.meStartMs, 0)} ms and answers at ${f(w.meEndMs, 0)} ms; the patient's request starts at ${f(w.patientStartMs, 0)} ms (side by side with \`me\` in ${w.parallel} of ${w.runs} loads).`,
    );
  }
  lines.push(...csvLines(r));
  return lines.join('\n');
}

/** The Recall desk's table: each filter's first page over HTTP and its statements' EXPLAIN. */
function deskTable(r) {
  const lines = [`## Recall desk, ${r.settings.patients} patients (median of 12 requests over HTTP, first page)`, ''];
  lines.push(
    '| filter | median ms | max ms | total | SQL time in EXPLAIN ms | buffers | scans all exams | plan |',
    '|---|---|---|---|---|---|---|---|',
  );
  for (const [name, d] of Object.entries(r.large.desk)) {
    const e = r.explains[name] ?? {};
    lines.push(
      `| ${name} | ${f(d.medianMs)} | ${f(d.maxMs)} | ${d.total} | ${f(e.executionMs)} | ${e.sharedBuffers ?? '—'} | ${e.scansAllExams ? 'yes' : 'no'} | ${e.file ?? ''} |`,
    );
  }
  return lines;
}

function csvLines(r) {
  const c = r.large.csv;
  const e = r.explains['CSV export'];
  return [
    '',
    `CSV export of every row: median ${f(c.medianMs, 0)} ms, ${(c.bytes / 1024).toFixed(0)} KB; API CPU ${c.apiCpuMs === undefined ? '—' : `${f(c.apiCpuMs, 0)} ms`} per export; API RSS ${f(c.rssBeforeMb, 0)} MB before, ${f(c.rssPeakMb, 0)} MB at its peak.`,
    '',
    ...(e ? [`CSV statement in EXPLAIN: ${f(e.executionMs)} ms, ${e.sharedBuffers} buffers (${e.file}).`] : []),
    '',
    `Seeding: demo ${f(r.seeding.demoSeconds)} s; large practice ${r.seeding.large.reused ? 'reused from the last run' : `${f(r.seeding.large.seconds)} s`}. Whole run ${f(r.totalSeconds, 0)} s.`,
    '',
  ];
}

function deskMarkdown(r) {
  return [`# Recall desk benchmark — ${r.at}`, '', ...deskTable(r), ...csvLines(r)].join('\n');
}
