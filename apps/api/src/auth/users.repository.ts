import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { patientShares, practices, users } from '../db/schema/index.js';
import type { SessionUser } from './session-user.js';

export async function findUserForSignIn(db: Db, email: string) {
  const [row] = await db
    .select({ id: users.id, passwordHash: users.passwordHash, active: users.active })
    .from(users)
    .where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

/** Ends every session of the user issued up to now (whole seconds, as in a JWT's iat). */
export async function endSessions(db: Db, userId: string): Promise<void> {
  await db
    .update(users)
    .set({ sessionsValidAfter: sql`date_trunc('second', now())` })
    .where(eq(users.id, userId));
}

/**
 * Loads the session user with the patients shared with them; null when gone, inactive, or when
 * the token was issued (`issuedAtS`, seconds) before the user's last sign-out.
 */
export async function findSessionUser(db: Db, userId: string, issuedAtS?: number): Promise<SessionUser | null> {
  const [row] = await db
    .select({
      id: users.id,
      email: users.email,
      displayName: users.displayName,
      role: users.role,
      practiceId: users.practiceId,
      practiceName: practices.name,
      active: users.active,
      sessionsValidAfter: users.sessionsValidAfter,
    })
    .from(users)
    .innerJoin(practices, eq(practices.id, users.practiceId))
    .where(eq(users.id, userId));
  if (!row || !row.active) return null;
  if (issuedAtS !== undefined && row.sessionsValidAfter && issuedAtS * 1000 < row.sessionsValidAfter.getTime())
    return null;
  const shares = await db
    .select({ patientId: patientShares.patientId })
    .from(patientShares)
    .where(and(eq(patientShares.sharedWithUserId, userId), isNull(patientShares.revokedAt)));
  const { active: _active, sessionsValidAfter: _validAfter, ...user } = row;
  return { ...user, sharedPatientIds: shares.map((s) => s.patientId) };
}
