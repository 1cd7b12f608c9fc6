import { and, eq, sql } from 'drizzle-orm';
import type { ActiveShare } from '@torquetrail/authz';
import type { Database, Db } from '../db/database.js';
import { liveShare } from '../db/live-share.js';
import { preparedFor } from '../db/prepared.js';
import { patientShares, practices, users } from '../db/schema/index.js';
import type { SessionUser } from './session-user.js';

export async function findUserForSignIn(db: Db, email: string) {
  const [row] = await db
    .select({ id: users.id, passwordHash: users.passwordHash, active: users.active })
    .from(users)
    .where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

/** The password hash and e-mail of a user (changing one's password checks the current one). */
export async function findCredentials(db: Db, userId: string) {
  const [row] = await db
    .select({ email: users.email, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.id, userId));
  return row ?? null;
}

/**
 * Ends every session of the user: the version goes up by one, so tokens issued under the old one
 * are refused. Only when `fromVersion` is still current (a stale token cannot end newer sessions).
 */
export async function endSessions(db: Db, userId: string, fromVersion: number): Promise<void> {
  await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(and(eq(users.id, userId), eq(users.sessionVersion, fromVersion)));
}

/** A new password hash; every session ends. Returns the new session version. */
export async function setPassword(db: Db, userId: string, passwordHash: string): Promise<number> {
  const [row] = await db
    .update(users)
    .set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ sessionVersion: users.sessionVersion });
  return row.sessionVersion;
}

/**
 * Loads the session user with their live shares and their session version; null when gone or
 * inactive. The caller compares the version with the token's. One prepared statement (the shares
 * as a JSON array beside the user): it runs on every request, and is never cached, so a share
 * revoked or past its end date closes at the surgeon's next request. Several live shares of one
 * patient add up.
 */
export async function findSessionUser(
  db: Database,
  userId: string,
): Promise<(SessionUser & { sessionVersion: number }) | null> {
  const [row] = await sessionUserQuery(db).execute({ userId });
  if (!row || !row.active) return null;
  const { active: _active, shares, ...user } = row;
  return { ...user, sharedPatientIds: [...new Set(shares.map((s) => s.patientId))], shares };
}

const sessionUserQuery = preparedFor((db) =>
  db
    .select({
      id: users.id,
      email: users.email,
      displayName: users.displayName,
      role: users.role,
      practiceId: users.practiceId,
      practiceName: practices.name,
      idleSignOutMinutes: practices.idleSignOutMinutes,
      dateFormat: practices.dateFormat,
      active: users.active,
      sessionVersion: users.sessionVersion,
      shares: sql<ActiveShare[]>`coalesce((select json_agg(json_build_object(
          'patientId', ${patientShares.patientId}, 'scopes', ${patientShares.scopes}, 'siteIds', ${patientShares.siteIds},
          'endsOn', ${patientShares.endsOn}))
        from ${patientShares} where ${patientShares.sharedWithUserId} = ${users.id} and ${liveShare()}), '[]'::json)`,
    })
    .from(users)
    .innerJoin(practices, eq(practices.id, users.practiceId))
    .where(eq(users.id, sql.placeholder('userId')))
    .prepare('session_user'),
);
