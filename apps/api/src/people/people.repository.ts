import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Role } from '@torquetrail/authz';
import { alias } from 'drizzle-orm/pg-core';
import type { Db } from '../db/database.js';
import { invitations, patientShares, practices, users } from '../db/schema/index.js';

const personColumns = {
  id: users.id,
  practiceId: users.practiceId,
  email: users.email,
  displayName: users.displayName,
  role: users.role,
  active: users.active,
  createdAt: users.createdAt,
};

export const listPeople = (db: Db, practiceId: string) =>
  db.select(personColumns).from(users).where(eq(users.practiceId, practiceId)).orderBy(asc(users.displayName));

export async function findPerson(db: Db, id: string) {
  const [row] = await db.select(personColumns).from(users).where(eq(users.id, id));
  return row ?? null;
}

export async function findUserIdByEmail(db: Db, email: string): Promise<string | null> {
  const [row] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  return row?.id ?? null;
}

/** Locks the practice's active administrators (the last one may not be demoted or deactivated). */
export async function lockActiveAdmins(db: Db, practiceId: string): Promise<string[]> {
  const rows = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.practiceId, practiceId), eq(users.role, 'practice_admin'), eq(users.active, true)))
    .for('update');
  return rows.map((r) => r.id);
}

export async function setRole(db: Db, id: string, role: Role): Promise<void> {
  await db.update(users).set({ role }).where(eq(users.id, id));
}

/** Deactivates a user and ends every session of theirs at once (the version goes up). */
export async function deactivateUser(db: Db, id: string): Promise<void> {
  await db
    .update(users)
    .set({ active: false, deactivatedAt: new Date(), sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, id));
}

// ---- invitations ---------------------------------------------------------------------------
const inviter = alias(users, 'inviter');
const invitationColumns = {
  id: invitations.id,
  practiceId: invitations.practiceId,
  email: invitations.email,
  role: invitations.role,
  invitedByName: inviter.displayName,
  createdAt: invitations.createdAt,
  expiresAt: invitations.expiresAt,
  mailStatus: invitations.mailStatus,
  mailSentAt: invitations.mailSentAt,
  mailRound: invitations.mailRound,
  acceptedAt: invitations.acceptedAt,
  revokedAt: invitations.revokedAt,
};

export const listInvitations = (db: Db, practiceId: string) =>
  db
    .select(invitationColumns)
    .from(invitations)
    .innerJoin(inviter, eq(inviter.id, invitations.invitedBy))
    .where(and(eq(invitations.practiceId, practiceId), eq(invitations.ownPractice, false)))
    .orderBy(desc(invitations.createdAt));

export async function findInvitation(db: Db, id: string) {
  const [row] = await db
    .select(invitationColumns)
    .from(invitations)
    .innerJoin(inviter, eq(inviter.id, invitations.invitedBy))
    .where(and(eq(invitations.id, id), eq(invitations.ownPractice, false)));
  return row ?? null;
}

export async function insertInvitation(
  db: Db,
  v: { practiceId: string; email: string; role: Role; invitedBy: string; linkOrigin: string },
): Promise<string> {
  const [row] = await db.insert(invitations).values(v).returning({ id: invitations.id });
  return row.id;
}

/** A new mail round: the link mailed before stops working at once. Returns the round. */
export async function restartInvitationMail(db: Db, id: string, linkOrigin: string): Promise<number> {
  const [row] = await db
    .update(invitations)
    .set({
      mailRound: sql`${invitations.mailRound} + 1`,
      tokenHash: null,
      expiresAt: null,
      mailStatus: 'pending',
      mailAttempts: 0,
      mailError: null,
      mailSentAt: null,
      linkOrigin,
    })
    .where(eq(invitations.id, id))
    .returning({ round: invitations.mailRound });
  return row.round;
}

export async function revokeInvitation(db: Db, id: string, by: string): Promise<void> {
  await db
    .update(invitations)
    .set({ revokedAt: new Date(), revokedBy: by })
    .where(and(eq(invitations.id, id), isNull(invitations.revokedAt), isNull(invitations.acceptedAt)));
}

/** The invitation a link's token opens, with the practice's name; locked when accepting. */
export async function findInvitationByToken(db: Db, tokenHash: string, lock = false) {
  const query = db
    .select({
      id: invitations.id,
      practiceId: invitations.practiceId,
      practiceName: practices.name,
      email: invitations.email,
      role: invitations.role,
      ownPractice: invitations.ownPractice,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
    })
    .from(invitations)
    .innerJoin(practices, eq(practices.id, invitations.practiceId))
    .where(eq(invitations.tokenHash, tokenHash));
  const [row] = lock ? await query.for('update', { of: invitations }) : await query;
  return row ?? null;
}

/**
 * The invitee's account, made from the invitation, in the inviting practice or (`ownPractice`) in
 * a new practice of the given name; the invitation is used up.
 */
export async function acceptInvitation(
  db: Db,
  invitation: { id: string; practiceId: string; email: string; role: Role; ownPractice: boolean },
  v: { displayName: string; passwordHash: string; practiceName: string | null },
): Promise<{ userId: string; practiceId: string }> {
  let practiceId = invitation.practiceId;
  if (invitation.ownPractice) {
    const [practice] = await db
      .insert(practices)
      .values({ name: v.practiceName ?? '' })
      .returning({ id: practices.id });
    practiceId = practice.id;
  }
  const [user] = await db
    .insert(users)
    .values({
      practiceId,
      email: invitation.email,
      role: invitation.role,
      displayName: v.displayName,
      passwordHash: v.passwordHash,
    })
    .returning({ id: users.id });
  await db
    .update(invitations)
    .set({ acceptedAt: new Date(), acceptedUserId: user.id })
    .where(eq(invitations.id, invitation.id));
  return { userId: user.id, practiceId };
}

/**
 * The shares that waited for this address to sign up become the new surgeon's: those of the
 * accepted invitation and of other practices' invitations of the same address still open (one
 * account serves them all; those invitations are used up too). Returns the shares opened.
 */
export async function openInvitedShares(db: Db, email: string, userId: string) {
  const waiting = await db
    .update(invitations)
    .set({ acceptedAt: new Date(), acceptedUserId: userId })
    .where(
      and(
        eq(invitations.email, email),
        eq(invitations.ownPractice, true),
        isNull(invitations.revokedAt),
        sql`(${invitations.acceptedAt} is null or ${invitations.acceptedUserId} = ${userId})`,
        sql`(${invitations.expiresAt} is null or ${invitations.expiresAt} > now())`,
      ),
    )
    .returning({ id: invitations.id });
  if (waiting.length === 0) return [];
  return db
    .update(patientShares)
    .set({ sharedWithUserId: userId })
    .where(
      and(
        inArray(
          patientShares.invitationId,
          waiting.map((w) => w.id),
        ),
        isNull(patientShares.sharedWithUserId),
        isNull(patientShares.revokedAt),
      ),
    )
    .returning({ id: patientShares.id, practiceId: patientShares.practiceId, patientId: patientShares.patientId });
}

// ---- practice settings ---------------------------------------------------------------------
