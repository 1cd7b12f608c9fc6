import type { Database } from './database.js';
import { withCompiledRowMapper } from './row-mapper.js';

/**
 * A hot read built once per database handle and sent as a named statement: Drizzle builds its SQL
 * a single time, and PostgreSQL parses and plans it once per connection instead of on every
 * request. `build` must end in `.prepare(name)` with a name used nowhere else (PostgreSQL keys the
 * connection's statements by it). Only for the database itself: a transaction handle lives for one
 * request, so there is nothing to reuse. Its rows are mapped by a mapper compiled once for the
 * query (row-mapper.ts).
 */
export function preparedFor<T>(build: (db: Database) => T): (db: Database) => T {
  const built = new WeakMap<Database, T>();
  return (db) => {
    let query = built.get(db);
    if (query === undefined) {
      query = withCompiledRowMapper(build(db));
      built.set(db, query);
    }
    return query;
  };
}
