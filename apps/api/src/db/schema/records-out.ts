import { sql } from 'drizzle-orm';
import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { reminderStatusEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';

/**
 * One request to e-mail a patient their implant passport, sent by the job queue with the same
 * delivery states as reminders: pending until SMTP accepts it (then sent, once), failed after
 * the last retry. The PDF is rendered when asked for and kept in object storage, so the mail
 * carries what the dentist asked to send even if the record changes before SMTP answers. At most
 * one pending request per patient.
 */
export const passportMails = pgTable(
  'passport_mails',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    sentTo: text('sent_to').notNull(),
    objectKey: text('object_key').notNull(),
    status: reminderStatusEnum('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    messageId: text('message_id'),
    requestedBy: uuid('requested_by')
      .notNull()
      .references(() => users.id),
    requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (t) => [
    index('passport_mails_patient_idx').on(t.patientId, t.requestedAt),
    uniqueIndex('passport_mails_one_pending')
      .on(t.patientId)
      .where(sql`${t.status} = 'pending'`),
  ],
);
