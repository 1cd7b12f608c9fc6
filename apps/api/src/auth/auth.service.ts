import { Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { reportActor } from '../common/audit-context.js';
import { DB, type Database } from '../db/database.js';
import { DUMMY_HASH_PROMISE, verifyPassword } from './password.js';
import type { SessionToken, SessionUser } from './session-user.js';
import { endSessions, findSessionUser, findUserForSignIn } from './users.repository.js';

@Injectable()
export class AuthService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly jwt: JwtService,
  ) {}

  /** Checks the password and returns the session user with a signed token; 401 with one plain message otherwise. */
  async signIn(email: string, password: string): Promise<{ user: SessionUser; token: string }> {
    const found = await findUserForSignIn(this.db, email);
    // Hash even when the e-mail is unknown, so the answer time does not tell which e-mails exist.
    const ok = await verifyPassword(password, found?.passwordHash ?? (await DUMMY_HASH_PROMISE));
    const user = found && ok && found.active ? await findSessionUser(this.db, found.id) : null;
    // The audit row names the account tried, when the e-mail is one (a failed sign-in included).
    reportActor(found ? { userId: found.id } : null);
    if (!user) throw new UnauthorizedException('The e-mail or password is not right');
    const payload: SessionToken = { sub: user.id };
    return { user, token: await this.jwt.signAsync(payload) };
  }

  loadSessionUser(userId: string, issuedAtS?: number): Promise<SessionUser | null> {
    return findSessionUser(this.db, userId, issuedAtS);
  }

  /** Sign-out ends the user's sessions on the server too, so a copied cookie stops working. */
  async signOut(token: string | undefined): Promise<void> {
    if (!token) return;
    const payload = await this.jwt.verifyAsync<SessionToken>(token).catch(() => null);
    if (payload?.sub) {
      reportActor({ userId: payload.sub });
      await endSessions(this.db, payload.sub);
    }
  }
}
