// `npm run backup` and `npm run restore` as an operator runs them, against the real test database
// and the S3 fake: the round trip keeps every row and every object byte for byte, and a restore
// refuses a non-empty target or a tampered backup.
import { execFile } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { DeleteBucketCommand, DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command } from '@aws-sdk/client-s3';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, createPool } from '../src/db/database.js';
import { StorageService } from '../src/storage/storage.service.js';
import { ownerDatabaseUrl, startTestApp, type TestContext } from './support/test-app.js';

const run = promisify(execFile);
const repoRoot = path.resolve(import.meta.dirname, '../../..');
const script = (name: string) => path.join(repoRoot, 'scripts', `${name}.mjs`);

let ctx: TestContext;
let storage: StorageService;
// Backup and restore run as the owner; the API's own role only reads and writes rows.
const sourceUrl = ownerDatabaseUrl();
const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tt-backup-'));
const backupDir = path.join(workDir, 'backup');
// The scripts read the API's variables; PORT=0 (the tests' own app) is not a port they accept.
const { PORT: _port, ...scriptEnv } = process.env;
const targets: { database: string; bucket: string }[] = [];
/**
 * A backup or restore copies every object: the demo seed's radiograph files (about a hundred) took
 * a round trip to 58 s on a loaded 2-core machine, so these tests get two minutes.
 */
const ROUND_TRIP_MS = 120_000;

/** A new, empty database and bucket name to restore into; each test has its own. */
async function emptyTarget() {
  const id = randomUUID().slice(0, 8);
  const target = { database: `tt_restore_${id}`, bucket: `tt-restore-${id}` };
  targets.push(target);
  await admin(`create database "${target.database}"`);
  const url = new URL(sourceUrl);
  url.pathname = `/${target.database}`;
  const appUrl = new URL(process.env.DATABASE_URL!);
  appUrl.pathname = `/${target.database}`;
  return {
    ...target,
    url: url.toString(),
    appUrl: appUrl.toString(),
    env: {
      ...scriptEnv,
      MIGRATION_DATABASE_URL: url.toString(),
      DATABASE_URL: appUrl.toString(),
      S3_BUCKET: target.bucket,
    },
  };
}

async function admin(statement: string) {
  const client = new pg.Client({ connectionString: sourceUrl });
  await client.connect();
  try {
    await client.query(statement);
  } finally {
    await client.end();
  }
}

/** Row count of every table of the product and the migration journal. */
async function rowCounts(url: string): Promise<Record<string, number>> {
  const pool = createPool(url);
  const db = createDatabase(pool);
  try {
    const tables = await db.execute<{ s: string; t: string }>(
      sql`select schemaname as s, tablename as t from pg_tables where schemaname in ('public', 'drizzle') order by 1, 2`,
    );
    const counts: Record<string, number> = {};
    for (const { s, t } of tables.rows) {
      const result = await db.execute<{ n: number }>(sql.raw(`select count(*)::int as n from "${s}"."${t}"`));
      counts[`${s}.${t}`] = result.rows[0].n;
    }
    return counts;
  } finally {
    await pool.end();
  }
}

/** key → SHA-256 of every object in a bucket, read back through the SDK. */
async function objectHashes(bucket: string): Promise<Record<string, string>> {
  const hashes: Record<string, string> = {};
  const list = await storage.client.send(new ListObjectsV2Command({ Bucket: bucket }));
  for (const object of list.Contents ?? []) {
    const reply = await storage.client.send(new GetObjectCommand({ Bucket: bucket, Key: object.Key }));
    hashes[object.Key!] = createHash('sha256')
      .update(await reply.Body!.transformToByteArray())
      .digest('hex');
  }
  return hashes;
}

beforeAll(async () => {
  ctx = await startTestApp();
  storage = ctx.app.get(StorageService);
  // Objects of every shape the product stores: binary bytes and a nested key.
  await storage.put(
    `tests/${randomUUID()}.bin`,
    Buffer.from(Array.from({ length: 50_000 }, (_, i) => (i * 31) % 256)),
    'application/octet-stream',
  );
  await storage.put(`practice/p1/${randomUUID()}.pdf`, Buffer.from('%PDF-1.4 test'), 'application/pdf');
  const backup = await run(process.execPath, [script('backup'), '--out', backupDir], { env: scriptEnv });
  if (!backup.stdout.includes('[backup] done')) throw new Error(`backup did not finish:\n${backup.stdout}`);
}, ROUND_TRIP_MS);

afterAll(async () => {
  await ctx.close();
  for (const { database, bucket } of targets) {
    await admin(`drop database if exists "${database}" with (force)`);
    const list = await storage.client.send(new ListObjectsV2Command({ Bucket: bucket })).catch(() => null);
    // The seed's radiograph files make about a hundred objects per bucket: delete them 16 at a time.
    const keys = (list?.Contents ?? []).map((o) => o.Key);
    for (let i = 0; i < keys.length; i += 16)
      await Promise.all(
        keys.slice(i, i + 16).map((Key) => storage.client.send(new DeleteObjectCommand({ Bucket: bucket, Key }))),
      );
    await storage.client.send(new DeleteBucketCommand({ Bucket: bucket })).catch(() => undefined);
  }
  fs.rmSync(workDir, { recursive: true, force: true });
}, 90_000);

describe('backup and restore (npm run backup / npm run restore)', () => {
  it(
    'round-trips every row and every object byte for byte into an empty database and bucket',
    async () => {
      const target = await emptyTarget();
      const manifest = JSON.parse(fs.readFileSync(path.join(backupDir, 'manifest.json'), 'utf8'));
      expect(manifest.format).toBe('torquetrail-backup/1');

      const restore = await run(process.execPath, [script('restore'), backupDir], { env: target.env });
      expect(restore.stdout).toContain('every hash verified');
      expect(restore.stdout).not.toContain('row counts differ');

      const before = await rowCounts(sourceUrl);
      const after = await rowCounts(target.url);
      expect(Object.keys(before).length).toBeGreaterThan(15);
      expect(before['public.patients']).toBeGreaterThan(0);
      expect(after).toEqual(before);
      expect(manifest.database.rows).toEqual(before);

      // The dump carries no grants: the restore gives the API's role its rights again, and no more.
      const asApp = new pg.Client({ connectionString: target.appUrl });
      await asApp.connect();
      try {
        const patients = await asApp.query('select count(*)::int as n from patients');
        expect(patients.rows[0].n).toBe(before['public.patients']);
        await expect(asApp.query(`update audit_events set action = 'read'`)).rejects.toThrow(/permission denied/);
      } finally {
        await asApp.end();
      }

      const sourceObjects = await objectHashes(storage.bucket);
      expect(Object.keys(sourceObjects).length).toBeGreaterThanOrEqual(2);
      expect(await objectHashes(target.bucket)).toEqual(sourceObjects);
    },
    ROUND_TRIP_MS,
  );

  it(
    'refuses to restore over a non-empty database and bucket unless told (--force)',
    async () => {
      const target = await emptyTarget();
      await run(process.execPath, [script('restore'), backupDir], { env: target.env });
      const refused = await run(process.execPath, [script('restore'), backupDir], { env: target.env }).catch(
        (error: { code: number; stderr: string }) => error,
      );
      expect(refused).toMatchObject({ code: 1 });
      expect((refused as { stderr: string }).stderr).toContain('refusing to restore');

      const forced = await run(process.execPath, [script('restore'), backupDir, '--force'], { env: target.env });
      expect(forced.stdout).toContain('every hash verified');
      expect(await rowCounts(target.url)).toEqual(await rowCounts(sourceUrl));
    },
    ROUND_TRIP_MS,
  );

  it(
    'refuses a backup whose files do not match the manifest, and writes nothing',
    async () => {
      const tampered = path.join(workDir, 'tampered');
      fs.cpSync(backupDir, tampered, { recursive: true });
      const manifest = JSON.parse(fs.readFileSync(path.join(tampered, 'manifest.json'), 'utf8'));
      fs.appendFileSync(path.join(tampered, 'objects', manifest.bucket.objects[0].sha256), 'x');
      const target = await emptyTarget();
      const refused = await run(process.execPath, [script('restore'), tampered], { env: target.env }).catch(
        (error: { code: number; stderr: string }) => error,
      );
      expect(refused).toMatchObject({ code: 1 });
      expect((refused as { stderr: string }).stderr).toContain('does not match its hash');
      expect(await rowCounts(target.url)).toEqual({});
      expect(await objectHashes(target.bucket).catch(() => ({}))).toEqual({});
    },
    ROUND_TRIP_MS,
  );
});
