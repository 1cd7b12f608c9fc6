import { sql } from 'drizzle-orm';
import type { Db } from '../db/database.js';

/** The database answers a trivial query; never throws, so the health check answers when it is down. */
export const isDatabaseUp = (db: Db): Promise<boolean> => db.execute(sql`select 1`).then(() => true, () => false);
