import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { roleEnum } from './enums.js';

export const practices = pgTable('practices', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
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
    /** Sessions (JWTs) issued before this instant are refused: set by sign-out. */
    sessionsValidAfter: timestamp('sessions_valid_after', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('users_practice_idx').on(t.practiceId)],
);
