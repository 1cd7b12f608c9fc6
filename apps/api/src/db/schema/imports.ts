import { date, index, integer, jsonb, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { implantSites } from './sites.js';

/**
 * One legacy CSV file imported into a practice (docs/import.md). The file's SHA-256 is the
 * idempotency key: the same file imported again finds this row and writes nothing.
 */
export const legacyImports = pgTable(
  'legacy_imports',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    sha256: text('sha256').notNull(),
    fileName: text('file_name').notNull(),
    rowCount: integer('row_count').notNull(),
    counts: jsonb('counts').$type<Record<string, number>>().notNull(),
    rulesVersion: text('rules_version').notNull(),
    importedBy: uuid('imported_by')
      .notNull()
      .references(() => users.id),
    importedAt: timestamp('imported_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('legacy_imports_practice_sha256_unique').on(t.practiceId, t.sha256)],
);

/**
 * Which record each row of an imported file wrote: the mark the Timeline shows ("imported from
 * FILE, row N"). One row of the file writes one record of each table at most (a placement row
 * writes its site and its placement), so (import, row, table) is unique.
 */
export const importEntries = pgTable(
  'import_entries',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    importId: uuid('import_id')
      .notNull()
      .references(() => legacyImports.id),
    rowNumber: integer('row_number').notNull(),
    /** The table of the record written (placements, restorations, torque_events …). */
    recordTable: text('record_table').notNull(),
    recordId: uuid('record_id').notNull(),
  },
  (t) => [
    unique('import_entries_row_unique').on(t.importId, t.rowNumber, t.recordTable),
    index('import_entries_record_idx').on(t.recordId),
  ],
);

/**
 * A part brought in by an import whose reference is not in the catalogue and that the user
 * chose to keep as free text: no catalogue version to point at, so it is not a component instance
 * (and no torque can be judged against it); the Timeline shows it as recorded.
 */
export const importedFreeTextParts = pgTable(
  'imported_free_text_parts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    partRef: text('part_ref').notNull(),
    partName: text('part_name'),
    lot: text('lot'),
    installedOn: date('installed_on', { mode: 'string' }).notNull(),
  },
  (t) => [
    index('imported_free_text_parts_site_idx').on(t.siteId),
    index('imported_free_text_parts_patient_idx').on(t.patientId),
  ],
);
