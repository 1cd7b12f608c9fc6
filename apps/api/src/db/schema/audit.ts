import { index, jsonb, pgTable, smallint, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { auditActionEnum, auditOutcomeEnum, roleEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';

/**
 * The audit trail (issue 11): one row per read of patient data, per export, per change and per
 * sign-in. Append-only: the application's database role may INSERT and SELECT here, nothing else
 * (migration 0014_app-role and docs/security.md). Who and their role are copied at the time of
 * the event, so a later role change does not rewrite history.
 */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    /**
     * Whose trail the row is in: the practice of the patient record it touched, else the user's
     * own practice. Null only when nobody could be named (a failed sign-in of an unknown e-mail).
     */
    practiceId: uuid('practice_id').references(() => practices.id),
    userId: uuid('user_id').references(() => users.id),
    role: roleEnum('role'),
    action: auditActionEnum('action').notNull(),
    outcome: auditOutcomeEnum('outcome').notNull(),
    httpStatus: smallint('http_status'),
    /** The route as declared (`GET /sites/:id`), never the URL with its query string. */
    route: text('route'),
    recordType: text('record_type'),
    recordId: uuid('record_id'),
    patientId: uuid('patient_id').references(() => patients.id),
    /** A list read names its query (the parsed filters), not every patient it returned. */
    query: jsonb('query'),
    before: jsonb('before'),
    after: jsonb('after'),
    address: text('address'),
    userAgent: text('user_agent'),
    requestId: text('request_id'),
  },
  (t) => [
    index('audit_events_practice_at_idx').on(t.practiceId, t.at),
    index('audit_events_practice_patient_at_idx').on(t.practiceId, t.patientId, t.at),
    index('audit_events_practice_user_at_idx').on(t.practiceId, t.userId, t.at),
  ],
);
