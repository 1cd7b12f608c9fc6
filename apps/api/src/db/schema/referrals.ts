import { sql } from 'drizzle-orm';
import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { reminderStatusEnum } from './enums.js';
import { patientShares, patients } from './patients.js';
import { practices, users } from './practices.js';

/**
 * One request to e-mail a patient's referral summary (PDF) to the surgeon of a share, sent by the
 * job queue with the delivery states of reminders: pending until SMTP accepts it, then sent once;
 * failed after the last retry. The PDF is drawn when it is sent, from the record as it then is.
 * The caller's idempotency key makes a second press of the same button the same request.
 */
export const referralSummaryMails = pgTable(
  'referral_summary_mails',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    shareId: uuid('share_id')
      .notNull()
      .references(() => patientShares.id),
    sentTo: text('sent_to').notNull(),
    idempotencyKey: uuid('idempotency_key').notNull(),
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
    index('referral_summary_mails_share_idx').on(t.shareId),
    uniqueIndex('referral_summary_mails_idempotency_unique').on(t.practiceId, t.idempotencyKey),
    index('referral_summary_mails_patient_idx').on(t.patientId, t.requestedAt),
    // One request waiting per share: pressing again while one waits adds nothing.
    uniqueIndex('referral_summary_mails_one_pending')
      .on(t.shareId)
      .where(sql`${t.status} = 'pending'`),
  ],
);
