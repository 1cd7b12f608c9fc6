import { sql } from 'drizzle-orm';
import { index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import { seatingAnswerEnum, seatingEventEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { radiographs } from './radiographs.js';
import { restorations } from './restorations.js';

/**
 * A radiograph attached to a restoration's delivery or impression as the seating check. Amended,
 * never edited: a correction is a new row superseding the old one, with its reason.
 */
export const seatingChecks = pgTable(
  'seating_checks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    event: seatingEventEnum('event').notNull(),
    radiographId: uuid('radiograph_id')
      .notNull()
      .references(() => radiographs.id),
    seated: seatingAnswerEnum('seated').notNull(),
    note: text('note'),
    recordedBy: uuid('recorded_by')
      .notNull()
      .references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
  },
  (t) => [
    index('seating_checks_patient_idx').on(t.patientId),
    index('seating_checks_radiograph_idx').on(t.radiographId),
    index('seating_checks_restoration_idx').on(t.restorationId),
    // One first version per delivery or impression; later ones are amendments of it. Two first
    // checks racing are decided here.
    uniqueIndex('seating_checks_first_unique')
      .on(t.restorationId, t.event)
      .where(sql`${t.supersedesId} is null`),
    ...amendmentChain('seating_checks', t),
  ],
);
