/** The fields of a PostgreSQL error (node-postgres) that the API answers differently. */
export interface PostgresError {
  code: string;
  constraint?: string;
}

/** The PostgreSQL error itself, also when drizzle wraps it (DrizzleQueryError keeps it as `cause`). */
export function postgresError(error: unknown): PostgresError | null {
  for (
    let e = error, depth = 0;
    typeof e === 'object' && e !== null && depth < 5;
    e = (e as { cause?: unknown }).cause, depth++
  ) {
    if (typeof (e as { code?: unknown }).code === 'string') return e as PostgresError;
  }
  return null;
}

/** PostgreSQL's unique violation (23505), on any unique index or only on the one named. */
export function isUniqueViolation(error: unknown, constraint?: string): boolean {
  const pg = postgresError(error);
  return pg?.code === '23505' && (constraint === undefined || pg.constraint === constraint);
}
