// Applies the drizzle-kit migrations in ./drizzle as the database's owner: MIGRATION_DATABASE_URL
// (DATABASE_URL when that is the owner's, as before the API had its own role). Exits non-zero on
// failure. The same function migrates the test database, so tests run on what production runs.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { createDatabase, createPool } from './database.js';
import { backfillPlacementGtins } from './gtin-backfill.js';

export const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../../drizzle');

export async function runMigrations(databaseUrl: string): Promise<void> {
  const pool = createPool(databaseUrl);
  try {
    const db = createDatabase(pool);
    await migrate(db, { migrationsFolder });
    // Data the SQL cannot derive (it needs the GS1 parser): after the schema is in place.
    await backfillPlacementGtins(db);
  } finally {
    await pool.end();
  }
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const url = process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL;
  if (!url) {
    console.error('MIGRATION_DATABASE_URL (the owner) is not set');
    process.exit(2);
  }
  runMigrations(url).then(
    () => console.log('[migrate] database is up to date'),
    (error: unknown) => {
      console.error(`[migrate] failed: ${error instanceof Error ? error.message : String(error)}`);
      process.exit(1);
    },
  );
}
