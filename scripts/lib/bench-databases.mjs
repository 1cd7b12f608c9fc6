// The two databases the Site-file benchmark compares: the demo scenario as `npm start` seeds it,
// and the same database grown by the large practice (scripts/lib/bench-large-seed.mjs). The large
// one is a copy of the demo one, so the demo's sites keep their ids and the same URLs are measured.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pgModule from 'pg';
import { apiEnvironment, host, ownerEnvironment, pg, repoRoot, s3 } from './config.mjs';
import { migrateDatabase } from './bootstrap.mjs';
import { ensureDatabase } from './postgres.mjs';

const dist = (p) => pathToFileURL(path.join(repoRoot, 'apps/api/dist', p)).href;

const BENCH_JWT_SECRET = 'bench-only-secret-bench-only-secret-0123';

/** The API's environment for a bench database (its own restricted role, as in production). */
export const benchEnv = (database) => ({
  ...apiEnvironment({ database, bucket: s3.bucket, jwtSecret: BENCH_JWT_SECRET, port: 0 }),
  LOG_LEVEL: 'silent',
});

export const ownerUrl = (database) => ownerEnvironment(database).MIGRATION_DATABASE_URL;

/** Runs `fn` with a client connected to `database` as the owner, and closes it afterwards. */
export async function withOwner(database, fn) {
  const client = new pgModule.Client({ connectionString: ownerUrl(database) });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** A fresh, migrated database holding the demo scenario (seeded through the API's own seed). */
export async function prepareDemoDatabase(database) {
  await ensureDatabase(database, { fresh: true });
  const env = benchEnv(database);
  await migrateDatabase(database, env);
  const { createPool, createDatabase } = await import(dist('db/database.js'));
  const { seedDemo } = await import(dist('seed/demo.js'));
  const { StorageService } = await import(dist('storage/storage.service.js'));
  const { parseEnv } = await import(dist('config/env.js'));
  const pool = createPool(ownerUrl(database));
  const storage = new StorageService(parseEnv({ ...process.env, ...env }));
  try {
    await createDatabase(pool).transaction((tx) => seedDemo(tx, new Date().toISOString().slice(0, 10), storage));
  } finally {
    storage.onModuleDestroy();
    await pool.end();
  }
}

/** `target` as a byte-for-byte copy of `source` (PostgreSQL's template copy: fast, no replay). */
export async function cloneDatabase(source, target) {
  const client = new pgModule.Client({
    host,
    port: pg.port,
    user: pg.user,
    password: pg.password,
    database: 'postgres',
  });
  await client.connect();
  try {
    await client.query(`drop database if exists "${target}" with (force)`);
    await client.query(`create database "${target}" template "${source}"`);
  } finally {
    await client.end();
  }
}
