import { Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { type Me, passwordProblem } from '@torquetrail/contracts';
import { reportActor } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { DUMMY_HASH_PROMISE, hashPassword, verifyPassword } from './password.js';
import type { SessionToken, SessionUser } from './session-user.js';
import { endSessions, findCredentials, findSessionUser, findUserForSignIn, setPassword } from './users.repository.js';

const nowS = () => Math.floor(Date.now() / 1000);

/** A signed session token and how long its cookie should live, seconds. */
export interface IssuedSession {
  token: string;
  lifetimeS: number;
}

@Injectable()
export class AuthService {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(ENV) private readonly env: Env,
    private readonly jwt: JwtService,
  ) {}

  /** Checks the password and returns the session user with a signed token; 401 with one plain message otherwise. */
  async signIn(email: string, password: string): Promise<{ user: SessionUser } & IssuedSession> {
    const found = await findUserForSignIn(this.db, email);
    // Hash even when the e-mail is unknown, so the answer time does not tell which e-mails exist.
    const ok = await verifyPassword(password, found?.passwordHash ?? (await DUMMY_HASH_PROMISE));
    const user = found && ok && found.active ? await findSessionUser(this.db, found.id) : null;
    // The audit row names the account tried, when the e-mail is one (a failed sign-in included).
    reportActor(found ? { userId: found.id } : null);
    if (!user) throw new UnauthorizedException('The e-mail or password is not right');
    const authTimeS = nowS();
    const issued = await this.issue(user.id, user.sessionVersion, authTimeS);
    return { user: { ...user, session: { authTimeS, issuedAtS: authTimeS } }, ...issued };
  }

  /**
   * A token for the session that began at `authTimeS`, under the user's current session version.
   * It never outlives the absolute session length (sign in again then: OWASP ASVS 3.3.2).
   */
  async issue(userId: string, sessionVersion: number, authTimeS: number): Promise<IssuedSession> {
    const lifetimeS = Math.min(this.env.SESSION_TTL_S, authTimeS + this.env.SESSION_ABSOLUTE_S - nowS());
    const payload: SessionToken = { sub: userId, sv: sessionVersion, at: authTimeS };
    return { token: await this.jwt.signAsync(payload, { expiresIn: Math.max(lifetimeS, 1) }), lifetimeS };
  }

  /**
   * The user of a verified token, or null: gone, deactivated, signed out since (the version), or
   * past the absolute session length.
   */
  async loadSessionUser(payload: SessionToken): Promise<SessionUser | null> {
    const { sub, sv, at, iat } = payload;
    if (typeof sv !== 'number' || typeof at !== 'number' || typeof iat !== 'number') return null;
    if (nowS() - at >= this.env.SESSION_ABSOLUTE_S) return null;
    const user = await findSessionUser(this.db, sub);
    if (!user || user.sessionVersion !== sv) return null;
    return { ...user, session: { authTimeS: at, issuedAtS: iat } };
  }

  /** A fresh token when the request's is older than SESSION_RENEW_AFTER_S (null otherwise). */
  async renewIfOld(user: SessionUser & { sessionVersion?: number }): Promise<IssuedSession | null> {
    if (!user.session || user.sessionVersion === undefined) return null;
    if (nowS() - user.session.issuedAtS < this.env.SESSION_RENEW_AFTER_S) return null;
    return this.issue(user.id, user.sessionVersion, user.session.authTimeS);
  }

  /** What the web needs to sign out an idle session and to know when re-authentication comes. */
  sessionInfo(user: SessionUser): Me['session'] {
    const idleSignOutS = this.env.SESSION_IDLE_OVERRIDE_S ?? user.idleSignOutMinutes * 60;
    const authTimeS = user.session?.authTimeS ?? nowS();
    return {
      idleSignOutS,
      // A minute's warning, or half the period when it is shorter than two minutes (tests).
      warnBeforeS: Math.min(60, Math.floor(idleSignOutS / 2)),
      reauthenticateAt: new Date((authTimeS + this.env.SESSION_ABSOLUTE_S) * 1000).toISOString(),
    };
  }

  /**
   * Sign-out ends every session of the user on the server too, so a copied cookie stops working,
   * at once (the version, not a time cut-off). A token already ended changes nothing.
   */
  async signOut(token: string | undefined): Promise<void> {
    if (!token) return;
    const payload = await this.jwt.verifyAsync<SessionToken>(token).catch(() => null);
    if (payload?.sub) reportActor({ userId: payload.sub });
    if (payload?.sub && typeof payload.sv === 'number') await endSessions(this.db, payload.sub, payload.sv);
  }

  /**
   * Changes the signed-in user's password (the current one required): every other session ends,
   * and this one goes on with a new token.
   */
  async changePassword(user: SessionUser, currentPassword: string, newPassword: string): Promise<IssuedSession> {
    const credentials = await findCredentials(this.db, user.id);
    if (!credentials || !(await verifyPassword(currentPassword, credentials.passwordHash)))
      throw fieldError({ currentPassword: 'The current password is not right' });
    const problem = passwordProblem(newPassword, credentials.email);
    if (problem) throw fieldError({ newPassword: problem });
    const version = await setPassword(this.db, user.id, await hashPassword(newPassword));
    return this.issue(user.id, version, user.session?.authTimeS ?? nowS());
  }
}
