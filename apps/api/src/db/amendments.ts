import { sql, type SQL } from 'drizzle-orm';
import type { AnyPgColumn, PgTable } from 'drizzle-orm/pg-core';

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
