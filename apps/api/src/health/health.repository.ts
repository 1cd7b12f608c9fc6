import { sql } from 'drizzle-orm';
import type { Db } from '../db/database.js';

/** True when the database answers a trivial query. */
export function databaseAnswers(db: Db): Promise<boolean> {
  return db.execute(sql`select 1`).then(
    () => true,
    () => false,
  );
}
