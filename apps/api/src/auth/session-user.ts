import type { ActiveShare, Role } from '@torquetrail/authz';
import type { DateFormat } from '@torquetrail/contracts';

/** The signed-in user, loaded fresh from the database on every request. */
export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  practiceId: string;
  practiceName: string;
  sharedPatientIds: string[];
  /** The live shares behind them, with scope and sites (never cached: loaded with the user). */
  shares: ActiveShare[];
  /** The practice's idle sign-out period, minutes. */
  idleSignOutMinutes: number;
  /** The order the practice writes and types dates in. */
  dateFormat: DateFormat;
  /** From the request's token: when the person signed in and when the token was issued (seconds). */
  session?: { authTimeS: number; issuedAtS: number };
}

/** What the session cookie's JWT carries. */
export interface SessionToken {
  sub: string;
  /** The user's session version when issued: sign-out, deactivation and resets add one. */
  sv?: number;
  /** When the person signed in, seconds since the epoch (kept across renewals). */
  at?: number;
  /** Issued at and expiry, seconds since the epoch (set by the signer; a token lacking either is refused). */
  iat?: number;
  exp?: number;
}

/** The one algorithm sessions are signed and verified with; a token in any other is refused. */
export const SESSION_ALGORITHM = 'HS256';

export const SESSION_COOKIE = 'tt_session';
