import { sql } from 'drizzle-orm';
import { boolean, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { reminderStatusEnum, roleEnum } from './enums.js';
import { practices, users } from './practices.js';

/** Mail state shared by the two kinds of one-time link (the status list is that of outgoing mail). */
const mailColumns = () => ({
  /** sha-256 of the link's token (base64url); null until the mail with the link is sent. */
  tokenHash: text('token_hash').unique(),
  expiresAt: timestamp('expires_at', { withTimezone: true }),
  mailStatus: reminderStatusEnum('mail_status').notNull().default('pending'),
  mailAttempts: integer('mail_attempts').notNull().default(0),
  mailError: text('mail_error'),
  mailSentAt: timestamp('mail_sent_at', { withTimezone: true }),
  /** The web app's address for the link (APP_URL, or the requesting page's own origin outside production). */
  linkOrigin: text('link_origin').notNull(),
});

/** An invitation to join a practice with a role; accepted once through a one-time link. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    email: text('email').notNull(),
    role: roleEnum('role').notNull(),
    /**
     * A referring surgeon new to Torquetrail, invited by sharing a patient: they join no existing
     * practice but one of their own, created under the name they give when they accept.
     */
    ownPractice: boolean('own_practice').notNull().default(false),
    invitedBy: uuid('invited_by')
      .notNull()
      .references(() => users.id),
    /** Each re-send is a new round: a job of an earlier round sends nothing. */
    mailRound: integer('mail_round').notNull().default(1),
    ...mailColumns(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    acceptedUserId: uuid('accepted_user_id').references(() => users.id),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    revokedBy: uuid('revoked_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('invitations_practice_idx').on(t.practiceId, t.createdAt),
    // One open invitation per address and practice: a second one would be a re-send.
    uniqueIndex('invitations_open_email_unique')
      .on(t.practiceId, t.email)
      .where(sql`accepted_at is null and revoked_at is null`),
  ],
);

/** A request for a password reset link; used once, within 30 minutes of its mail. */
export const passwordResets = pgTable(
  'password_resets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id),
    ...mailColumns(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    /** A later request (or a completed reset) ends this one. */
    supersededAt: timestamp('superseded_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('password_resets_user_idx').on(t.userId, t.createdAt)],
);
