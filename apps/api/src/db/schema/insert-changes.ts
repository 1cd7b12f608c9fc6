import { date, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import { components } from './catalogue.js';
import { insertChangeReasonEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { restorations } from './restorations.js';
import { implantSites } from './sites.js';

/**
 * A retentive insert (or bar clip) changed at one site of a delivered overdenture: the catalogue
 * part taken out (when known) and the one put in. Amended by a superseding row, never overwritten.
 */
export const insertChanges = pgTable(
  'insert_changes',
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
    /** The overdenture (the version current when the change was first logged). */
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    changedOn: date('changed_on', { mode: 'string' }).notNull(),
    oldComponentId: uuid('old_component_id').references(() => components.id),
    newComponentId: uuid('new_component_id')
      .notNull()
      .references(() => components.id),
    reason: insertChangeReasonEnum('reason').notNull(),
    notes: text('notes'),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('insert_changes_site_idx').on(t.siteId, t.changedOn),
    index('insert_changes_patient_idx').on(t.patientId),
    ...amendmentChain('insert_changes', t),
  ],
);
