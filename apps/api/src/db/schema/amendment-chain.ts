import { type AnyPgColumn, foreignKey, uniqueIndex } from 'drizzle-orm/pg-core';

/** The tables whose rows are amended by a superseding row, never overwritten. */
export const AMENDABLE_TABLES = [
  'placements',
  'restorations',
  'torque_events',
  'complications',
  'recall_exams',
  'components',
  'torque_wrenches',
  'radiograph_measurements',
  'seating_checks',
  'impressions',
  'insert_changes',
  'scan_body_markers',
] as const;
export type AmendableTableName = (typeof AMENDABLE_TABLES)[number];

/** The unique index that keeps an amendable table to one amendment per version. */
export const supersedesUniqueName = (table: AmendableTableName) => `${table}_supersedes_unique`;

/**
 * The amendment chain of a table, enforced by the database: `supersedes_id` names a row of the
 * same table, and at most one row supersedes any version. First versions have NULL there, which
 * a PostgreSQL unique index allows any number of times. The index also serves the "is this the
 * current version" probe (db/amendments.ts).
 */
export const amendmentChain = (table: AmendableTableName, t: { id: AnyPgColumn; supersedesId: AnyPgColumn }) => [
  uniqueIndex(supersedesUniqueName(table)).on(t.supersedesId),
  foreignKey({ name: `${table}_supersedes_fk`, columns: [t.supersedesId], foreignColumns: [t.id] }),
];
