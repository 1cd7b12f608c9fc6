import { and, eq, isNull } from 'drizzle-orm';
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

/** Loads the session user with the patients shared with them; null when gone or inactive. */
export async function findSessionUser(db: Db, userId: string): Promise<SessionUser | null> {
  const [row] = await db
    .select({
      id: users.id,
      email: users.email,
      displayName: users.displayName,
      role: users.role,
      practiceId: users.practiceId,
      practiceName: practices.name,
      active: users.active,
    })
    .from(users)
    .innerJoin(practices, eq(practices.id, users.practiceId))
    .where(eq(users.id, userId));
  if (!row || !row.active) return null;
  const shares = await db
    .select({ patientId: patientShares.patientId })
    .from(patientShares)
    .where(and(eq(patientShares.sharedWithUserId, userId), isNull(patientShares.revokedAt)));
  const { active: _active, ...user } = row;
  return { ...user, sharedPatientIds: shares.map((s) => s.patientId) };
}
