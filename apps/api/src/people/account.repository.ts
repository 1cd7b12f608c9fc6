// SQL of the one-time links: mailing them (invitations and password resets) and using a reset.
import { and, eq, gt, isNull, ne, sql } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { invitations, passwordResets, practices, users } from '../db/schema/index.js';

export type LinkKind = 'invitation' | 'password-reset';

/** The invitation to mail, locked for the send, with what the mail says. */
export async function lockInvitationMail(db: Db, id: string) {
  const [row] = await db
    .select({
      id: invitations.id,
      email: invitations.email,
      round: invitations.mailRound,
      mailStatus: invitations.mailStatus,
      open: sql<boolean>`${invitations.acceptedAt} is null and ${invitations.revokedAt} is null`,
      linkOrigin: invitations.linkOrigin,
      ownPractice: invitations.ownPractice,
      practiceName: practices.name,
      dateFormat: practices.dateFormat,
      inviterName: users.displayName,
    })
    .from(invitations)
    .innerJoin(practices, eq(practices.id, invitations.practiceId))
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.id, id))
    .for('update', { of: invitations });
  return row ?? null;
}

/** The reset to mail, locked for the send; `fresh` while within the link's validity of its request. */
export async function lockResetMail(db: Db, id: string, validMs: number) {
  const [row] = await db
    .select({
      id: passwordResets.id,
      email: users.email,
      mailStatus: passwordResets.mailStatus,
      open: sql<boolean>`${passwordResets.usedAt} is null and ${passwordResets.supersededAt} is null and ${users.active}`,
      fresh: sql<boolean>`${passwordResets.createdAt} > now() - ${`${validMs} milliseconds`}::interval`,
      linkOrigin: passwordResets.linkOrigin,
      dateFormat: practices.dateFormat,
    })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .innerJoin(practices, eq(practices.id, users.practiceId))
    .where(eq(passwordResets.id, id))
    .for('update', { of: passwordResets });
  return row ?? null;
}

const table = (kind: LinkKind) => (kind === 'invitation' ? invitations : passwordResets);

/** The link is live from now on: its token's hash and expiry are stored as the mail goes out. */
export async function markLinkMailed(db: Db, kind: LinkKind, id: string, tokenHash: string, expiresAt: Date) {
  const t = table(kind);
  await db
    .update(t)
    .set({ tokenHash, expiresAt, mailStatus: 'sent', mailSentAt: new Date(), mailError: null })
    .where(eq(t.id, id));
}

export async function markLinkMailFailed(db: Db, kind: LinkKind, id: string, error: string, final: boolean) {
  const t = table(kind);
  await db
    .update(t)
    .set({
      mailAttempts: sql`${t.mailAttempts} + 1`,
      mailError: error.slice(0, 500),
      mailStatus: final ? 'failed' : 'pending',
    })
    .where(eq(t.id, id));
}

/** Links still waiting for their mail (the sweep queues a send for each). */
export async function listPendingLinkMails(db: Db) {
  const open = await db
    .select({ id: invitations.id, round: invitations.mailRound })
    .from(invitations)
    .where(and(eq(invitations.mailStatus, 'pending'), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
  const resets = await db
    .select({ id: passwordResets.id })
    .from(passwordResets)
    .where(
      and(
        eq(passwordResets.mailStatus, 'pending'),
        isNull(passwordResets.usedAt),
        isNull(passwordResets.supersededAt),
        gt(passwordResets.createdAt, sql`now() - interval '30 minutes'`),
      ),
    );
  return { invitations: open, resets };
}

// ---- password resets -----------------------------------------------------------------------
export async function findActiveUserByEmail(db: Db, email: string) {
  const [row] = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.email, email), eq(users.active, true)));
  return row ?? null;
}

/** A new reset request; earlier open requests of the user end (only the newest link works). */
export async function insertReset(db: Db, userId: string, linkOrigin: string): Promise<string> {
  await db
    .update(passwordResets)
    .set({ supersededAt: new Date() })
    .where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt), isNull(passwordResets.supersededAt)));
  const [row] = await db.insert(passwordResets).values({ userId, linkOrigin }).returning({ id: passwordResets.id });
  return row.id;
}

export async function findResetByToken(db: Db, tokenHash: string, lock = false) {
  const query = db
    .select({
      id: passwordResets.id,
      userId: passwordResets.userId,
      email: users.email,
      active: users.active,
      expiresAt: passwordResets.expiresAt,
      usedAt: passwordResets.usedAt,
      supersededAt: passwordResets.supersededAt,
    })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .where(eq(passwordResets.tokenHash, tokenHash));
  const [row] = lock ? await query.for('update', { of: passwordResets }) : await query;
  return row ?? null;
}

/** Sets the new password, ends every session of the user and uses the link up (and any other open one). */
export async function completeReset(db: Db, reset: { id: string; userId: string }, passwordHash: string) {
  await db
    .update(users)
    .set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, reset.userId));
  await db.update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.id, reset.id));
  await db
    .update(passwordResets)
    .set({ supersededAt: new Date() })
    .where(
      and(
        eq(passwordResets.userId, reset.userId),
        ne(passwordResets.id, reset.id),
        isNull(passwordResets.usedAt),
        isNull(passwordResets.supersededAt),
      ),
    );
}
