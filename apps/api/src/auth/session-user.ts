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
  /** Issued at, seconds since the epoch (set by the signer). */
  iat?: number;
}

export const SESSION_COOKIE = 'tt_session';
