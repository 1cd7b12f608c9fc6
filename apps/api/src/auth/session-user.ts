import type { Role } from '@torquetrail/authz';

/** The signed-in user, loaded fresh from the database on every request. */
export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  practiceId: string;
  practiceName: string;
  sharedPatientIds: string[];
}

/** What the session cookie's JWT carries. */
export interface SessionToken {
  sub: string;
  /** Issued at and expiry, seconds since the epoch (set by the signer; a token lacking either is refused). */
  iat?: number;
  exp?: number;
}

/** The one algorithm sessions are signed and verified with; a token in any other is refused. */
export const SESSION_ALGORITHM = 'HS256';

export const SESSION_COOKIE = 'tt_session';
