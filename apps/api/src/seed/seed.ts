// Seeds the demo practice when the database has no practice yet (npm start runs this).
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { sql } from 'drizzle-orm';
import { parseEnv } from '../config/env.js';
import { createDatabase, createPool, type Database } from '../db/database.js';
import { practices } from '../db/schema/index.js';
import { StorageService } from '../storage/storage.service.js';
import { seedDemo } from './demo.js';
import type { SeedStorage } from './demo-radiographs.js';
import type { SeedSummary } from './demo-scenario.js';

export const todayIso = () => new Date().toISOString().slice(0, 10);

/** Seeds in one transaction; returns null when the database already holds a practice. */
export async function seedIfEmpty(db: Database, storage: SeedStorage, today = todayIso()): Promise<SeedSummary | null> {
  const [{ count }] = (await db.select({ count: sql<number>`count(*)::int` }).from(practices)) as [{ count: number }];
  if (count > 0) return null;
  return db.transaction((tx) => seedDemo(tx, today, storage));
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error('DATABASE_URL is not set');
    process.exit(2);
  }
  const pool = createPool(url);
  // The radiograph files go to the configured bucket through the same SDK client the API uses.
  const storage = new StorageService(parseEnv(process.env));
  seedIfEmpty(createDatabase(pool), storage)
    .then((summary) =>
      console.log(
        summary
          ? `[seed] demo practice seeded: ${summary.patients} patients, ${summary.sites} implant sites`
          : '[seed] database already has data; not seeding',
      ),
    )
    .catch((error: unknown) => {
      console.error(`[seed] failed: ${error instanceof Error ? error.message : String(error)}`);
      process.exitCode = 1;
    })
    .finally(() => {
      storage.onModuleDestroy();
      void pool.end();
    });
}
