import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index.js';

export type Database = NodePgDatabase<typeof schema>;
/** A transaction handle has the same query surface as the database. */
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Repositories take either, so a service can pass its transaction down. */
export type Db = Database | Tx;

/** Nest injection tokens. */
export const DB = Symbol('DB');
export const PG_POOL = Symbol('PG_POOL');

export function createPool(databaseUrl: string): pg.Pool {
  return new pg.Pool({ connectionString: databaseUrl, max: 10 });
}

export function createDatabase(pool: pg.Pool): Database {
  return drizzle(pool, { schema });
}
