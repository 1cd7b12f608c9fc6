// Shared set-up for the API tests: the real app on the real (test) PostgreSQL, reset to the
// freshly seeded demo scenario, driven over real HTTP with Supertest.
import { withDeadline } from '../../src/common/with-deadline.js';
import type { INestApplication } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import pg from 'pg';
import request from 'supertest';
import { createApp } from '../../src/app.js';
import { type Env, parseEnv } from '../../src/config/env.js';
import { createDatabase, createPool, type Database } from '../../src/db/database.js';
import { implantSites, patients, radiographs, scanFiles } from '../../src/db/schema/index.js';
import { StorageService } from '../../src/storage/storage.service.js';
import { DEMO_PASSWORD } from '../../src/seed/demo-scenario.js';
import { seedDemo } from '../../src/seed/demo.js';
import { todayIso } from '../../src/seed/seed.js';

export const testEnv = () => parseEnv({ ...process.env, NODE_ENV: 'test', WEB_DIST: '' });

export interface TestContext {
  app: INestApplication;
  http: ReturnType<typeof request>;
  db: Database;
  close: () => Promise<void>;
}

/**
 * The owner's connection (MIGRATION_DATABASE_URL): only the owner may empty the audit trail. The
 * tests' own `db` handle is the API's role, so what a test does to the data the app could do too.
 */
export function ownerDatabaseUrl(): string {
  const url = process.env.MIGRATION_DATABASE_URL;
  if (!url) throw new Error('MIGRATION_DATABASE_URL is not set: run the tests with scripts/test-tier.mjs');
  return url;
}

/** The test bucket, for the seed's radiograph files (one client for the whole test process). */
let seedStorage: StorageService | undefined;

/**
 * Empties every table of the test database (as the owner) and seeds the demo scenario again. The
 * radiograph and scan files of the rows about to go are deleted first, so the test bucket does not grow by
 * a seed's worth of files with every test file (other databases' files are left alone).
 */
export async function resetDatabase(db: Database): Promise<void> {
  seedStorage ??= new StorageService(testEnv());
  const storage = seedStorage;
  const existing = await db.select({ key: radiographs.objectKey }).from(radiographs);
  const scans = await db.select({ key: scanFiles.objectKey }).from(scanFiles);
  const keys = [
    ...existing.flatMap((r) => [r.key, `${r.key}.preview.png`, `${r.key}.thumbnail.png`]),
    ...scans.map((s) => s.key),
  ];
  const deleted = (async () => {
    for (let i = 0; i < keys.length; i += 16) {
      await Promise.all(keys.slice(i, i + 16).map((k) => storage.delete(k).catch(() => undefined)));
    }
  })();
  const owner = new pg.Client({ connectionString: ownerDatabaseUrl() });
  await owner.connect();
  try {
    const tables = await owner.query<{ tablename: string }>(
      `select tablename from pg_tables where schemaname = 'public'`,
    );
    const names = tables.rows.map((t) => `"${t.tablename}"`).join(', ');
    if (names) await owner.query(`TRUNCATE ${names} RESTART IDENTITY CASCADE`);
  } finally {
    await owner.end();
  }
  await db.transaction((tx) => seedDemo(tx, todayIso(), storage));
  await deleted;
}

/** The app on the test database; `overrides` change settings for one file (e.g. TRUST_PROXY). */
export async function startTestApp(overrides: Partial<Env> = {}): Promise<TestContext> {
  const env = { ...testEnv(), ...overrides };
  const pool = createPool(env.DATABASE_URL);
  const db = createDatabase(pool);
  await resetDatabase(db);
  const app = await createApp(env, { logger: false });
  return {
    app,
    http: request(app.getHttpServer()),
    db,
    close: async () => {
      await app.close();
      // Bounded like the app's own pool (DatabaseModule): a test that stopped PostgreSQL may leave
      // a client on a broken socket.
      await withDeadline(pool.end(), 10_000);
    },
  };
}

/** The demo accounts by the role they play in the tests. */
export const ACCOUNTS = {
  dentist: 'ines.calloway@larkspur.example',
  hygienist: 'maren.holt@larkspur.example',
  surgeon: 'rafael.imbert@northgate.example',
  practice_admin: 'odile.park@larkspur.example',
  otherPracticeDentist: 'nell.ashdown@quarryhill.example',
} as const;
export type AccountKey = keyof typeof ACCOUNTS;

/** Signs in through the real route and returns the session cookie to send with requests. */
export async function signIn(ctx: TestContext, who: AccountKey): Promise<string> {
  const res = await ctx.http.post('/api/auth/sign-in').send({ email: ACCOUNTS[who], password: DEMO_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in of ${who} failed: ${res.status} ${JSON.stringify(res.body)}`);
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('tt_session='));
  if (!cookie) throw new Error('no session cookie set');
  return cookie.split(';')[0];
}

export async function signInAll(ctx: TestContext): Promise<Record<AccountKey, string>> {
  const entries = await Promise.all(
    (Object.keys(ACCOUNTS) as AccountKey[]).map(async (k) => [k, await signIn(ctx, k)] as const),
  );
  return Object.fromEntries(entries) as Record<AccountKey, string>;
}

export async function patientId(db: Database, chartNumber: string): Promise<string> {
  const [row] = await db.select({ id: patients.id }).from(patients).where(eq(patients.chartNumber, chartNumber));
  if (!row) throw new Error(`no patient ${chartNumber}`);
  return row.id;
}

export async function siteId(db: Database, chartNumber: string, fdi: number): Promise<string> {
  const pid = await patientId(db, chartNumber);
  const [row] = await db
    .select({ id: implantSites.id })
    .from(implantSites)
    .where(and(eq(implantSites.patientId, pid), eq(implantSites.fdi, fdi)));
  if (!row) throw new Error(`no site ${fdi} for ${chartNumber}`);
  return row.id;
}
