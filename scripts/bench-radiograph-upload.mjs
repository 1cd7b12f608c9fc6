// Radiograph uploads under load: N parallel uploads of M MB (default 5 × 50 MB) through the API
// (a real process, a real session, real HTTP with Content-Length) against the same N files put
// straight to the S3 fake by @aws-sdk/lib-storage's Upload (its defaults: 5 MB parts, 4 in
// flight; the client is the API's own StorageService's, from apps/api/dist) — the floor. Once with
// 16-bit DICOM files, once with PNG files (stored uncompressed, so the size is the pixels'). The
// API process's resident memory is sampled from outside (/proc/<pid>/status VmRSS every 50 ms):
// its peak growth over the idle, warmed-up process while the uploads run (target ≤ 64 MB), and
// until every preview job has finished; a fresh, warmed-up API process for each kind of file.
// Inside the API a probe (lib/memory-probe.mjs) reports the V8 heap and the external (ArrayBuffer)
// memory at the same moments, so the growth can be told apart. The API is started as npm start
// starts it (API_NODE_OPTIONS, MALLOC_ARENA_MAX); TT_BENCH_NODE_DEFAULTS=1 starts it with Node's
// and glibc's defaults instead, and TT_BENCH_API_NODE_OPTIONS='--max-semi-space-size=4 …' with other
// heap options, for comparison (ADR 0007). Prints a table; nothing is asserted.
// Usage: node scripts/bench-radiograph-upload.mjs [files] [megabytes]
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import zlib from 'node:zlib';
import { CreateBucketCommand, DeleteObjectCommand, ListObjectsV2Command } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { API_NODE_OPTIONS, apiEnvironment, localDir, repoRoot } from './lib/config.mjs';
import { migrateDatabase, nodeScript } from './lib/bootstrap.mjs';
import { ensureDatabase } from './lib/postgres.mjs';
import { portOpen } from './lib/proc.mjs';
import { startServices } from './services.mjs';

const FILES = Number(process.argv[2] ?? 5);
const MEGABYTES = Number(process.argv[3] ?? 50);
const DATABASE = 'torquetrail_bench_radiographs';
const BUCKET = 'torquetrail-bench';
const API_PORT = Number(process.env.TT_BENCH_API_PORT || process.env.PORT || 3499);
const MB = 1024 * 1024;
// The SDK is pinned to the last line that supports Node 20 (DEVELOPERS.md); its notice is known.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';
const dist = (p) => pathToFileURL(path.join(repoRoot, 'apps/api/dist', p)).href;
const workDir = path.join(localDir, 'tmp', 'bench-radiographs');
const nodeDefaults = process.env.TT_BENCH_NODE_DEFAULTS === '1';

// ---- files --------------------------------------------------------------------------------------
/** A DICOM Part 10 element, explicit VR little endian (PS3.5 §7.1.2), value padded to even length. */
function element(group, number, vr, value) {
  let bytes = Buffer.isBuffer(value) ? value : Buffer.from(String(value), 'latin1');
  if (bytes.length % 2) bytes = Buffer.concat([bytes, Buffer.from([vr === 'UI' ? 0 : 0x20])]);
  const long = ['OB', 'OW', 'SQ', 'UN', 'UT'].includes(vr);
  const head = Buffer.alloc(long ? 12 : 8);
  head.writeUInt16LE(group, 0);
  head.writeUInt16LE(number, 2);
  head.write(vr, 4, 'latin1');
  if (long) head.writeUInt32LE(bytes.length, 8);
  else head.writeUInt16LE(bytes.length, 6);
  return Buffer.concat([head, bytes]);
}
const us = (n) => {
  const b = Buffer.alloc(2);
  b.writeUInt16LE(n);
  return b;
};

/** A 16-bit MONOCHROME2 intra-oral DICOM of about `bytes`, written row by row (never whole in memory). */
async function writeDicom(file, bytes, seed) {
  const side = Math.floor(Math.sqrt(bytes / 2));
  const uid = `2.25.${Date.now()}${seed}`;
  const meta = Buffer.concat([
    element(0x0002, 0x0001, 'OB', Buffer.from([0, 1])),
    element(0x0002, 0x0002, 'UI', '1.2.840.10008.5.1.4.1.1.1.3'),
    element(0x0002, 0x0003, 'UI', uid),
    element(0x0002, 0x0010, 'UI', '1.2.840.10008.1.2.1'),
    element(0x0002, 0x0012, 'UI', '2.25.1'),
  ]);
  const groupLength = Buffer.alloc(4);
  groupLength.writeUInt32LE(meta.length);
  const header = Buffer.concat([
    Buffer.alloc(128),
    Buffer.from('DICM'),
    element(0x0002, 0x0000, 'UL', groupLength),
    meta,
    element(0x0008, 0x0016, 'UI', '1.2.840.10008.5.1.4.1.1.1.3'),
    element(0x0008, 0x0018, 'UI', uid),
    element(0x0008, 0x0020, 'DA', '20240115'),
    element(0x0008, 0x0060, 'CS', 'IO'),
    element(0x0020, 0x0011, 'IS', seed),
    element(0x0028, 0x0002, 'US', us(1)),
    element(0x0028, 0x0004, 'CS', 'MONOCHROME2'),
    element(0x0028, 0x0010, 'US', us(side)),
    element(0x0028, 0x0011, 'US', us(side)),
    element(0x0028, 0x0030, 'DS', '0.05\\0.05'),
    element(0x0028, 0x0100, 'US', us(16)),
    element(0x0028, 0x0101, 'US', us(12)),
    element(0x0028, 0x0102, 'US', us(11)),
    element(0x0028, 0x0103, 'US', us(0)),
  ]);
  const pixelHead = Buffer.alloc(12);
  pixelHead.writeUInt16LE(0x7fe0, 0);
  pixelHead.writeUInt16LE(0x0010, 2);
  pixelHead.write('OW', 4, 'latin1');
  pixelHead.writeUInt32LE(side * side * 2, 8);
  const out = fs.createWriteStream(file);
  const write = (b) => (out.write(b) ? undefined : new Promise((r) => out.once('drain', r)));
  await write(Buffer.concat([header, pixelHead]));
  const row = Buffer.alloc(side * 2);
  for (let r = 0; r < side; r++) {
    // a grey "implant" band on a gradient with a little noise
    for (let c = 0; c < side; c++) {
      const implant = Math.abs(c - side / 2) < side / 12 && r > side / 5 && r < (side * 3) / 4 ? 2800 : 0;
      row.writeUInt16LE((((r + c) >> 2) % 1200) + implant + ((r * 31 + c * 17 + seed) & 63), c * 2);
    }
    await write(row);
  }
  await new Promise((resolve, reject) => out.end((e) => (e ? reject(e) : resolve())));
}

/** A PNG chunk: length, type, data, CRC-32 over type and data (ISO/IEC 15948 §5.3). */
function pngChunk(type, data) {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, 'latin1');
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(data, zlib.crc32(type)));
  return Buffer.concat([head, data, crc]);
}

/** An 8-bit greyscale PNG of about `bytes`, deflate level 0 (stored), so its size is its pixels'. */
async function writePng(file, bytes, seed) {
  const side = Math.floor(Math.sqrt(bytes));
  const scanlines = Buffer.alloc((side + 1) * side); // filter byte 0 (None) before each row
  for (let r = 0; r < side; r++) {
    for (let c = 0; c < side; c++) scanlines[r * (side + 1) + 1 + c] = (r + c + seed * 7) & 255;
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(side, 0);
  ihdr.writeUInt32BE(side, 4);
  ihdr.set([8, 0, 0, 0, 0], 8); // bit depth 8, colour type 0 (greyscale), deflate, no interlace
  const png = Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', zlib.deflateSync(scanlines, { level: 0 })),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
  fs.writeFileSync(file, png);
}

// ---- measuring ----------------------------------------------------------------------------------
const rssOf = (pid) => {
  const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
  if (!m) throw new Error('the API process has ended');
  return Number(m[1]) * 1024;
};

/** Samples a process's RSS every 50 ms; `peak()` since the last `reset()`. */
function rssSampler(pid) {
  let peak = 0;
  const timer = setInterval(() => {
    try {
      peak = Math.max(peak, rssOf(pid));
    } catch {
      clearInterval(timer);
    }
  }, 50);
  return {
    reset: () => {
      peak = rssOf(pid);
    },
    peak: () => Math.max(peak, rssOf(pid)),
    stop: () => clearInterval(timer),
  };
}

function request(method, urlPath, { headers = {}, body } = {}) {
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: '127.0.0.1', port: API_PORT, method, path: urlPath, headers, agent: false },
      (res) => {
        const chunks = [];
        res.on('data', (c) => chunks.push(c));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString();
          let json = null;
          try {
            json = JSON.parse(text);
          } catch {
            // not JSON
          }
          resolve({ status: res.statusCode, headers: res.headers, body: json });
        });
      },
    );
    req.on('error', reject);
    if (body instanceof fs.ReadStream) body.pipe(req);
    else req.end(body);
  });
}

async function uploadThroughApi(cookie, patientId, file, name) {
  const res = await request('POST', `/api/patients/${patientId}/radiographs?kind=other&fileName=${name}`, {
    headers: {
      Cookie: cookie,
      'Content-Type': 'application/octet-stream',
      'Content-Length': fs.statSync(file).size,
      Accept: 'application/json',
    },
    body: fs.createReadStream(file, { highWaterMark: MB }),
  });
  if (res.status !== 201) throw new Error(`upload of ${name}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id;
}

async function previewsDone(cookie, ids) {
  const outcome = {};
  for (const id of ids) {
    for (;;) {
      const res = await request('GET', `/api/radiographs/${id}`, { headers: { Cookie: cookie } });
      if (res.body?.previewStatus && res.body.previewStatus !== 'pending') {
        outcome[res.body.previewStatus] = (outcome[res.body.previewStatus] ?? 0) + 1;
        break;
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  return outcome;
}

// ---- the run ------------------------------------------------------------------------------------
await startServices();
await ensureDatabase(DATABASE, { fresh: true });
const env = {
  ...apiEnvironment({
    database: DATABASE,
    bucket: BUCKET,
    jwtSecret: 'bench-only-secret-bench-only-secret-0123',
    port: API_PORT,
  }),
  NODE_ENV: 'development',
  LOG_LEVEL: 'warn',
  RADIOGRAPH_DAILY_QUOTA_BYTES: String(100 * 1024 * MB),
};
// As the owner (the API's role may not create schemas), then the API's login (migration 0014).
await migrateDatabase(DATABASE, env);
const { StorageService } = await import(dist('storage/storage.service.js'));
const storage = new StorageService({ ...env, S3_BUCKET: BUCKET });
await storage.client.send(new CreateBucketCommand({ Bucket: BUCKET })).catch(() => undefined);
// After the bucket: the seed stores its radiographs in it.
await nodeScript('apps/api/dist/seed/seed.js', env);

fs.mkdirSync(workDir, { recursive: true });
const kinds = [
  { kind: 'dicom', ext: 'dcm', write: writeDicom },
  { kind: 'png', ext: 'png', write: writePng },
];
const files = {};
for (const { kind, ext, write } of kinds) {
  files[kind] = [];
  for (let i = 0; i < FILES; i++) {
    const file = path.join(workDir, `${kind}-${i}.${ext}`);
    await write(file, MEGABYTES * MB, i + 1);
    files[kind].push(file);
  }
}

if (await portOpen(API_PORT)) throw new Error(`port ${API_PORT} is taken; set TT_BENCH_API_PORT or PORT`);

/** Starts the API, signs in, and warms it with one small upload of `kind` and its preview. */
async function startApi(kind) {
  const probe = ['--import', pathToFileURL(path.join(repoRoot, 'scripts/lib/memory-probe.mjs')).href];
  // TT_BENCH_API_NODE_OPTIONS (space-separated) tries other heap options against the deployment's (ADR 0007).
  const tried = process.env.TT_BENCH_API_NODE_OPTIONS?.split(' ').filter(Boolean);
  const options = nodeDefaults ? probe : [...(tried ?? API_NODE_OPTIONS), ...probe];
  const apiEnv = { ...process.env, ...env };
  if (nodeDefaults) delete apiEnv.MALLOC_ARENA_MAX;
  const proc = spawn(process.execPath, [...options, path.join(repoRoot, 'apps/api/dist/main.js')], {
    cwd: repoRoot,
    env: apiEnv,
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  while (!(await portOpen(API_PORT))) {
    if (proc.exitCode !== null) throw new Error('the API stopped while starting');
    await new Promise((r) => setTimeout(r, 200));
  }
  const { DEMO_SIGN_INS, DEMO_PASSWORD } = await import(dist('seed/demo-scenario.js'));
  const signIn = await request('POST', '/api/auth/sign-in', {
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: DEMO_SIGN_INS[0].email, password: DEMO_PASSWORD }),
  });
  const cookie = [].concat(signIn.headers['set-cookie'] ?? []).find((c) => c.startsWith('tt_session='));
  if (!cookie) throw new Error(`sign-in failed: ${signIn.status}`);
  const session = cookie.split(';')[0];
  const patients = await request('GET', '/api/patients', { headers: { Cookie: session } });
  const patientId = (patients.body.items ?? patients.body)[0].id;
  const { ext, write } = kinds.find((k) => k.kind === kind);
  const small = path.join(workDir, `warm-${kind}.${ext}`);
  await write(small, MB, 900 + Math.floor(Math.random() * 1000));
  await previewsDone(session, [await uploadThroughApi(session, patientId, small, `warm.${ext}`)]);
  await new Promise((r) => setTimeout(r, 1500));
  return { proc, session, patientId };
}

/** The probe's current values and peaks since its previous report (MB), read from inside the API. */
function probeReport(proc) {
  const mb = (o) => Object.fromEntries(Object.entries(o).map(([k, v]) => [k, v / MB]));
  return new Promise((resolve) => {
    const onMessage = (message) => {
      if (!message?.memoryProbe) return;
      proc.off('message', onMessage);
      resolve({ now: mb(message.memoryProbe.now), peak: mb(message.memoryProbe.peak) });
    };
    proc.on('message', onMessage);
    proc.send('memory-probe');
  });
}

async function stopApi(proc) {
  proc.kill('SIGTERM');
  while (await portOpen(API_PORT)) await new Promise((r) => setTimeout(r, 100));
}

const results = [];
let api = null;
let sampler = null;
try {
  for (const { kind, ext } of kinds) {
    const totalMb = files[kind].reduce((sum, f) => sum + fs.statSync(f).size, 0) / MB;
    // The floor: the same files through lib-storage's Upload straight to the S3 fake.
    let t = performance.now();
    await Promise.all(
      files[kind].map((f, i) =>
        new Upload({
          client: storage.client,
          params: { Bucket: BUCKET, Key: `floor/${kind}-${i}`, Body: fs.createReadStream(f, { highWaterMark: MB }) },
        }).done(),
      ),
    );
    const floorS = (performance.now() - t) / 1000;

    // A fresh, warmed API process for each kind, so each baseline is its own.
    const { proc, session, patientId } = await startApi(kind);
    api = proc;
    sampler = rssSampler(api.pid);
    const baseline = rssOf(api.pid);
    const inside = await probeReport(api);
    sampler.reset();
    t = performance.now();
    const ids = await Promise.all(
      files[kind].map((f, i) => uploadThroughApi(session, patientId, f, `${kind}-${i}.${ext}`)),
    );
    const apiS = (performance.now() - t) / 1000;
    const uploadPeak = sampler.peak();
    const insideUpload = await probeReport(api);
    const outcome = await previewsDone(session, ids);
    const previewS = (performance.now() - t) / 1000 - apiS;
    const previewPeak = sampler.peak();
    const insidePreviews = await probeReport(api);
    sampler.stop();
    await stopApi(api);
    api = null;
    results.push({
      kind,
      files: FILES,
      totalMb,
      floorMbps: totalMb / floorS,
      apiMbps: totalMb / apiS,
      ratio: floorS / apiS,
      baselineMb: baseline / MB,
      uploadGrowthMb: (uploadPeak - baseline) / MB,
      previewS,
      previewGrowthMb: (previewPeak - baseline) / MB,
      heapGrowthMb: Math.max(insideUpload.peak.heapUsed, insidePreviews.peak.heapUsed) - inside.now.heapUsed,
      externalGrowthMb: Math.max(insideUpload.peak.external, insidePreviews.peak.external) - inside.now.external,
      previews: Object.entries(outcome)
        .map(([k, v]) => `${v} ${k}`)
        .join(', '),
    });
  }
} finally {
  sampler?.stop();
  if (api) await stopApi(api);
  // The bench's objects go again: a run writes about 2 × N × M MB to the fake's disk.
  for (let token; ;) {
    const page = await storage.client.send(new ListObjectsV2Command({ Bucket: BUCKET, ContinuationToken: token }));
    for (const o of page.Contents ?? [])
      await storage.client.send(new DeleteObjectCommand({ Bucket: BUCKET, Key: o.Key }));
    if (!page.IsTruncated) break;
    token = page.NextContinuationToken;
  }
  storage.onModuleDestroy();
  fs.rmSync(workDir, { recursive: true, force: true });
}

const f1 = (n) => n.toFixed(1);
console.log(
  `\n${FILES} parallel uploads of ${MEGABYTES} MB; API RSS sampled from /proc/<pid>/status every 50 ms (target: growth ≤ 64 MB);` +
    ` the API started with ${nodeDefaults ? "Node's and glibc's defaults" : `${process.env.TT_BENCH_API_NODE_OPTIONS ?? API_NODE_OPTIONS.join(' ')} and MALLOC_ARENA_MAX=2`}\n`,
);
const header = [
  'kind',
  'MB',
  'floor MB/s',
  'API MB/s',
  'API/floor',
  'RSS base MB',
  'Δ upload MB',
  'Δ +previews MB',
  'previews s',
  'Δ heap MB',
  'Δ external MB',
  'previews',
];
const rows = results.map((r) => [
  r.kind,
  f1(r.totalMb),
  f1(r.floorMbps),
  f1(r.apiMbps),
  r.ratio.toFixed(2),
  f1(r.baselineMb),
  f1(r.uploadGrowthMb),
  f1(r.previewGrowthMb),
  f1(r.previewS),
  f1(r.heapGrowthMb),
  f1(r.externalGrowthMb),
  r.previews,
]);
const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
for (const line of [header, ...rows]) console.log(line.map((c, i) => c.padStart(widths[i])).join('  '));
