// Which dependency an error says is out of reach. A request that fails because PostgreSQL or
// object storage cannot be reached is answered 503 with a plain message (never 500, never a false
// "signed out"), so a client knows to try again; everything else stays a 500.

/** Node's socket errors, seen when a server is down, restarting or unreachable. */
const SOCKET_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

/**
 * PostgreSQL's connection-level SQLSTATEs: class 08 (connection exception), 57P01 (terminated by
 * an administrator, as at `pg_ctl stop -m fast`), 57P02 (crash shutdown), 57P03 (cannot connect
 * now: starting up or shutting down), 53300 (too many connections).
 */
const POSTGRES_CODES = new Set(['08000', '08001', '08003', '08004', '08006', '57P01', '57P02', '57P03', '53300']);

/** node-postgres reports a lost or unobtainable connection with these messages and no code. */
const POSTGRES_MESSAGES = [
  /Connection terminated/i,
  /timeout exceeded when trying to connect/i,
  /Client has encountered a connection error/i,
  /Client was closed and is not queryable/i,
  /Cannot use a pool after calling end/i,
];

export type Dependency = 'database' | 'storage';

/** Thrown by StorageService when S3 cannot be reached (or answers with a server error). */
export class StorageUnavailableError extends Error {
  constructor(cause: unknown) {
    super('object storage is not reachable', { cause });
    this.name = 'StorageUnavailableError';
  }
}

export const UNAVAILABLE_MESSAGES: Record<Dependency, string> = {
  database: 'The database is not reachable; try again in a moment',
  storage: 'File storage is not reachable; try again in a moment',
};

/** Walks an error and its causes (drizzle and the AWS SDK wrap the original) for a sign of an unreachable dependency. */
export function unavailableDependency(error: unknown): Dependency | null {
  for (let e = error, depth = 0; typeof e === 'object' && e !== null && depth < 6; depth++) {
    if (e instanceof StorageUnavailableError) return 'storage';
    const { code, message, errors } = e as { code?: unknown; message?: unknown; errors?: unknown };
    if (typeof code === 'string' && (SOCKET_CODES.has(code) || POSTGRES_CODES.has(code))) return 'database';
    if (typeof message === 'string' && POSTGRES_MESSAGES.some((m) => m.test(message))) return 'database';
    // Node reports a refused connection to "localhost" (IPv4 and IPv6 tried) as an AggregateError.
    if (Array.isArray(errors) && errors.some((inner) => unavailableDependency(inner) !== null)) return 'database';
    e = (e as { cause?: unknown }).cause;
  }
  return null;
}
