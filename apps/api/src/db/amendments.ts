import { sql, type SQL } from 'drizzle-orm';
import type { AnyPgColumn, PgInsertValue, PgTable } from 'drizzle-orm/pg-core';
import type { Db } from './database.js';

/**
 * Clinical entries are amended, never overwritten: an amendment is a new row whose
 * `supersedes_id` points at the row it replaces. These are the three questions every query asks
 * of such a row, in one place. The inner table is aliased `newer`, so `${table.id}` is the outer row.
 */
type Amendable = PgTable & { id: AnyPgColumn };

/** The row is the current version (no newer row supersedes it). */
export const isCurrentVersion = (table: Amendable): SQL =>
  sql`not exists (select 1 from ${table} newer where newer.supersedes_id = ${table.id})`;

/** The row has been amended (a newer row supersedes it). */
export const isAmended = (table: Amendable): SQL<boolean> =>
  sql<boolean>`exists (select 1 from ${table} newer where newer.supersedes_id = ${table.id})`;

/** The id of the row that superseded this one, or null. */
export const supersededById = (table: Amendable): SQL<string | null> =>
  sql<string | null>`(select newer.id from ${table} newer where newer.supersedes_id = ${table.id} limit 1)`;

type Superseding = PgTable & { id: AnyPgColumn; supersedesId: AnyPgColumn };

/**
 * Inserts the row that supersedes `values.supersedesId` (in the caller's transaction when it has
 * one) and returns its id. The unique index on supersedes_id decides between two amendments of one
 * version: the later insert waits for the earlier transaction and, once that commits, fails with
 * a unique violation, which HttpExceptionFilter answers 409 (common/amendment-conflict.ts). No row
 * lock or re-check is needed for that; a caller locks only what else its amendment must exclude.
 */
export async function insertAmendment<T extends Superseding>(
  db: Db,
  table: T,
  values: PgInsertValue<T> & { supersedesId: string; amendmentReason: string },
): Promise<string> {
  const [row] = (await db.insert(table).values(values).returning({ id: table.id })) as { id: string }[];
  return row.id;
}
