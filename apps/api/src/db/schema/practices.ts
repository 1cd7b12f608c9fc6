import { boolean, index, integer, numeric, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { dateFormatEnum, roleEnum } from './enums.js';
import {
  DEFAULT_CALIBRATION_INTERVAL_MONTHS,
  DEFAULT_CANTILEVER_RATIO,
  DEFAULT_INSERT_REVIEW_MONTHS,
} from '@torquetrail/domain';

export const practices = pgTable('practices', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  /** Automatic sign-out after this many idle minutes (set by the practice administrator). */
  idleSignOutMinutes: integer('idle_sign_out_minutes').notNull().default(15),
  /** How a patient reaches the practice: printed on the implant passport. */
  phone: text('phone'),
  email: text('email'),
  address: text('address'),
  /**
   * A torque wrench is overdue this many months after its latest calibration (the practice's own
   * interval; DEFAULT_CALIBRATION_INTERVAL_MONTHS when it sets none).
   */
  wrenchCalibrationIntervalMonths: integer('wrench_calibration_interval_months')
    .notNull()
    .default(DEFAULT_CALIBRATION_INTERVAL_MONTHS),
  /** The last lab prescription number this practice drew (its numbers run 1, 2, 3 …). */
  labPrescriptionCounter: integer('lab_prescription_counter').notNull().default(0),
  /** The order the practice writes and types dates in, on screen and on its documents (issue 15 §7). */
  dateFormat: dateFormatEnum('date_format').notNull().default('day-month-year'),
  /**
   * A digital impression asks for a radiograph of the seated scan bodies (its seating check):
   * without one it carries a Finding. Off until the practice turns it on.
   */
  requireScanBodyRadiograph: boolean('require_scan_body_radiograph').notNull().default(false),
  /** Longest distal cantilever as a multiple of the A-P spread (the practice's own; default 1.5). */
  cantileverRatioLimit: numeric('cantilever_ratio_limit', { precision: 3, scale: 1, mode: 'number' })
    .notNull()
    .default(DEFAULT_CANTILEVER_RATIO),
  /** An overdenture's insert review falls due this many months after its last insert change (or delivery). */
  insertReviewIntervalMonths: integer('insert_review_interval_months').notNull().default(DEFAULT_INSERT_REVIEW_MONTHS),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    email: text('email').notNull().unique(),
    displayName: text('display_name').notNull(),
    role: roleEnum('role').notNull(),
    /** scrypt hash in the form scrypt$N$r$p$salt$hash (see auth/password.ts). */
    passwordHash: text('password_hash').notNull(),
    active: boolean('active').notNull().default(true),
    /**
     * Every session token carries the version it was issued under; sign-out, deactivation and a
     * password reset or change add one, which ends every token issued before, even in the same
     * second (a timestamp cut-off compared with a JWT's whole-second iat could not).
     */
    sessionVersion: integer('session_version').notNull().default(0),
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('users_practice_idx').on(t.practiceId)],
);
