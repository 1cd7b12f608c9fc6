// Backup and restore of one Torquetrail installation: the PostgreSQL database (pg_dump, custom
// format) and the S3 bucket's objects (through the AWS SDK, so a real S3 service works the same
// as the local fake), with a manifest of SHA-256 hashes and row counts to verify both.
// Used by scripts/backup.mjs and scripts/restore.mjs; see docs/security.md (Backups).
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Transform } from 'node:stream';
import {
  CreateBucketCommand,
  GetObjectCommand,
  HeadBucketCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import pgModule from 'pg';
import { capture } from './proc.mjs';
import { pgProgram } from './postgres.mjs';

const MANIFEST = 'manifest.json';
const DUMP = 'database.dump';
/** Schemas whose rows the manifest counts: the product's tables and the migration journal. */
const COUNTED_SCHEMAS = ['public', 'drizzle'];

export class BackupError extends Error {}

/**
 * The connection settings from the same environment variables the API reads, except that the
 * database is the owner's (MIGRATION_DATABASE_URL): the API's role may not read the migration
 * journal nor restore anything.
 */
export function targetFromEnv(env) {
  // The SDK is pinned to the last line that supports Node 20 (DEVELOPERS.md); silence its notice.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  for (const key of ['DATABASE_URL', 'S3_ENDPOINT', 'S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY']) {
    if (!env[key]) throw new BackupError(`${key} is not set`);
  }
  return {
    databaseUrl: env.MIGRATION_DATABASE_URL ?? env.DATABASE_URL,
    bucket: env.S3_BUCKET,
    s3: new S3Client({
      endpoint: env.S3_ENDPOINT,
      region: env.S3_REGION ?? 'us-east-1',
      credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
      forcePathStyle: true,
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    }),
  };
}

/** libpq arguments without the password (it goes through PGPASSWORD, never the process list). */
function libpq(databaseUrl) {
  const url = new URL(databaseUrl);
  const password = decodeURIComponent(url.password);
  url.password = '';
  return { dbname: url.toString(), env: { ...process.env, PGPASSWORD: password } };
}

const sha256File = async (file) => {
  const hash = createHash('sha256');
  await pipeline(fs.createReadStream(file), hash);
  return hash.digest('hex');
};

async function withClient(databaseUrl, fn) {
  const client = new pgModule.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** Row count of every table in the counted schemas, as { "schema.table": n }. */
function countRows(databaseUrl) {
  return withClient(databaseUrl, async (client) => {
    const tables = await client.query(
      `select schemaname, tablename from pg_tables where schemaname = any($1) order by schemaname, tablename`,
      [COUNTED_SCHEMAS],
    );
    const counts = {};
    for (const t of tables.rows) {
      const result = await client.query(`select count(*)::int as n from "${t.schemaname}"."${t.tablename}"`);
      counts[`${t.schemaname}.${t.tablename}`] = result.rows[0].n;
    }
    return counts;
  });
}

async function* listObjects(s3, bucket) {
  let token;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    for (const object of page.Contents ?? []) yield object;
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
}

/**
 * Writes DIR/database.dump, DIR/objects/<sha256> (content-addressed: an object key never becomes
 * a path) and DIR/manifest.json. Row counts are taken before the dump; on a busy installation
 * they may trail it, which restore reports rather than hides.
 */
export async function backup({ databaseUrl, s3, bucket }, dir, log = () => {}) {
  fs.mkdirSync(path.join(dir, 'objects'), { recursive: true });
  const rows = await countRows(databaseUrl);
  const { dbname, env } = libpq(databaseUrl);
  const dumpFile = path.join(dir, DUMP);
  log(`dumping the database (${Object.keys(rows).length} tables) …`);
  const dump = capture(
    pgProgram('pg_dump'),
    ['--format=custom', '--no-owner', '--no-acl', `--file=${dumpFile}`, `--dbname=${dbname}`],
    { env },
  );
  if (dump.status !== 0) throw new BackupError(`pg_dump failed: ${dump.stderr.trim()}`);

  const objects = [];
  for await (const object of listObjects(s3, bucket)) {
    const reply = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: object.Key }));
    const hash = createHash('sha256');
    const tmp = path.join(dir, 'objects', `.partial-${objects.length}`);
    let size = 0;
    const tap = new Transform({
      transform(chunk, _encoding, done) {
        hash.update(chunk);
        size += chunk.length;
        done(null, chunk);
      },
    });
    await pipeline(reply.Body, tap, fs.createWriteStream(tmp));
    const sha256 = hash.digest('hex');
    fs.renameSync(tmp, path.join(dir, 'objects', sha256));
    objects.push({ key: object.Key, size, sha256, contentType: reply.ContentType ?? null });
  }
  log(`copied ${objects.length} objects from bucket ${bucket}`);

  const manifest = {
    format: 'torquetrail-backup/1',
    createdAt: new Date().toISOString(),
    database: { file: DUMP, sha256: await sha256File(dumpFile), rows },
    bucket: { name: bucket, objects },
  };
  fs.writeFileSync(path.join(dir, MANIFEST), JSON.stringify(manifest, null, 2) + '\n');
  return manifest;
}

/** Reads the manifest and checks every file's hash before anything is restored. */
async function readVerifiedManifest(dir) {
  const file = path.join(dir, MANIFEST);
  if (!fs.existsSync(file)) throw new BackupError(`${file} is missing: not a backup folder`);
  const manifest = JSON.parse(fs.readFileSync(file, 'utf8'));
  if (manifest.format !== 'torquetrail-backup/1') throw new BackupError(`unknown backup format ${manifest.format}`);
  if ((await sha256File(path.join(dir, manifest.database.file))) !== manifest.database.sha256) {
    throw new BackupError('the database dump does not match its hash in the manifest');
  }
  for (const object of manifest.bucket.objects) {
    const stored = path.join(dir, 'objects', object.sha256);
    if (!fs.existsSync(stored) || (await sha256File(stored)) !== object.sha256) {
      throw new BackupError(`object ${object.key} is missing or does not match its hash`);
    }
  }
  return manifest;
}

async function databaseIsEmpty(databaseUrl) {
  return withClient(databaseUrl, async (client) => {
    const found = await client.query(
      `select count(*)::int as n from pg_tables where schemaname not in ('pg_catalog', 'information_schema')`,
    );
    return found.rows[0].n === 0;
  });
}

function emptyDatabase(databaseUrl) {
  return withClient(databaseUrl, async (client) => {
    const schemas = await client.query(
      `select nspname from pg_namespace where nspname not in ('pg_catalog', 'information_schema', 'pg_toast') and nspname not like 'pg\\_%'`,
    );
    await client.query('begin');
    for (const s of schemas.rows) await client.query(`drop schema "${s.nspname}" cascade`);
    await client.query('create schema public');
    await client.query('commit');
  });
}

/**
 * The dump carries no grants (--no-acl), so the API's role gets its rights again from the function
 * the migrations made (drizzle/0014_app-role.sql); a backup from before that migration has none.
 */
function grantAppRole(databaseUrl) {
  return withClient(databaseUrl, async (client) => {
    const found = await client.query(`select to_regprocedure('public.torquetrail_grant_app_role()') is not null as ok`);
    if (found.rows[0].ok) await client.query('select public.torquetrail_grant_app_role()');
  });
}

async function bucketIsEmpty(s3, bucket) {
  try {
    await s3.send(new HeadBucketCommand({ Bucket: bucket }));
  } catch (error) {
    if (error?.$metadata?.httpStatusCode === 404 || error?.name === 'NotFound') {
      await s3.send(new CreateBucketCommand({ Bucket: bucket }));
      return true;
    }
    throw error;
  }
  // One page is enough to tell (no MaxKeys: the local fake answers 500 to a MaxKeys below the count).
  const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket }));
  return (page.KeyCount ?? 0) === 0;
}

/**
 * Restores a verified backup into an empty database and bucket. A non-empty target is refused
 * unless `force`: then the database is emptied (pg_restore --clean) and objects with the same key
 * are overwritten. Returns the row counts found afterwards beside the manifest's.
 */
export async function restore({ databaseUrl, s3, bucket }, dir, { force = false, log = () => {} } = {}) {
  const manifest = await readVerifiedManifest(dir);
  const dbEmpty = await databaseIsEmpty(databaseUrl);
  const objectsEmpty = await bucketIsEmpty(s3, bucket);
  if (!force && (!dbEmpty || !objectsEmpty)) {
    const what = [!dbEmpty && 'the database has tables', !objectsEmpty && `bucket ${bucket} has objects`]
      .filter(Boolean)
      .join(' and ');
    throw new BackupError(
      `refusing to restore: ${what}. Restore into an empty database and bucket, or pass --force to overwrite.`,
    );
  }
  // pg_restore --clean cannot drop pg-boss's partitioned tables, so a forced restore empties the
  // database by dropping its schemas (the user owns them on any installation that runs migrations).
  if (!dbEmpty) await emptyDatabase(databaseUrl);
  const { dbname, env } = libpq(databaseUrl);
  log('restoring the database …');
  const args = ['--no-owner', '--no-acl', '--exit-on-error', '--single-transaction', `--dbname=${dbname}`];
  const restored = capture(pgProgram('pg_restore'), [...args, path.join(dir, manifest.database.file)], { env });
  if (restored.status !== 0) throw new BackupError(`pg_restore failed: ${restored.stderr.trim()}`);
  await grantAppRole(databaseUrl);

  for (const object of manifest.bucket.objects) {
    const file = path.join(dir, 'objects', object.sha256);
    await s3.send(
      new PutObjectCommand({
        Bucket: bucket,
        Key: object.key,
        Body: fs.createReadStream(file),
        ContentLength: object.size,
        ContentType: object.contentType ?? undefined,
      }),
    );
  }
  log(`restored ${manifest.bucket.objects.length} objects into bucket ${bucket}`);
  const rows = await countRows(databaseUrl);
  const differences = Object.keys({ ...rows, ...manifest.database.rows }).filter(
    (t) => rows[t] !== manifest.database.rows[t],
  );
  return { manifest, rows, differences };
}
