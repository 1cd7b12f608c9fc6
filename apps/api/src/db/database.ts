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

/**
 * Session settings of the API's connections. JIT compilation off: the API's statements are short
 * and planned for a handful of rows, where compiling costs more than it saves; on the Recall desk
 * at 10 000 patients it was most of the statement's time (docs/adr/0008-no-jit-for-the-api.md).
 * @public (read by the benchmark, scripts/bench/site-file-report.mjs)
 */
export const PG_SESSION_OPTIONS = '-c jit=off';

/**
 * The pool reports an idle client whose server went away (PostgreSQL stopped or restarted) as an
 * 'error' event, and so does a client in use (see below); without a listener Node ends the process. The pool drops that client and opens
 * a new one for the next query, so the listener only reports it. A connection attempt gives up
 * after 5 s (the request then answers 503) instead of waiting for ever.
 */
export function createPool(databaseUrl: string, onIdleError: (error: Error) => void = () => {}): pg.Pool {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: 10,
    connectionTimeoutMillis: 5000,
    options: PG_SESSION_OPTIONS,
  });
  pool.on('error', onIdleError);
  // A client checked out of the pool (inside a transaction, between its statements) has no pool
  // listener: its server going away would be an uncaught 'error' and end the process. The work on
  // it fails on its next statement (503) and the pool discards it; the listener only reports it.
  pool.on('connect', (client) => client.on('error', onIdleError));
  return pool;
}

export function createDatabase(pool: pg.Pool): Database {
  return drizzle(pool, { schema });
}
