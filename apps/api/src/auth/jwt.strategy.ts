import { createSecretKey } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import type { Request } from 'express';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { ENV, type Env } from '../config/env.js';
import { AuthService } from './auth.service.js';
import { SESSION_ALGORITHM, SESSION_COOKIE, type SessionToken, type SessionUser } from './session-user.js';

const fromSessionCookie = (req: Request): string | null => {
  const value = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
  return typeof value === 'string' && value.length > 0 ? value : null;
};

/** Reads the JWT from the HttpOnly session cookie (never from storage the page's script can read). */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy) {
  constructor(
    @Inject(ENV) env: Env,
    private readonly auth: AuthService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromExtractors([fromSessionCookie]),
      // A KeyObject: given a string, jsonwebtoken first tries it as a public key and falls back,
      // on every request (about 0.45 ms of CPU each, against 0.01 ms with the key made once).
      // passport-jwt hands the key to jsonwebtoken unchanged, which takes a KeyObject; only the
      // library's type still says string or Buffer.
      secretOrKey: createSecretKey(Buffer.from(env.JWT_SECRET, 'utf8')) as unknown as Buffer,
      // Pinned: the library would otherwise accept every HMAC variant signed with the secret.
      algorithms: [SESSION_ALGORITHM],
      ignoreExpiration: false,
    });
  }

  /**
   * Returning null makes passport answer 401: a token without an expiry or issue time (which
   * would never expire, or escape sign-out), a deactivated or signed-out user's token, and one
   * past the absolute session length.
   */
  async validate(payload: SessionToken): Promise<SessionUser | null> {
    if (typeof payload.exp !== 'number' || typeof payload.iat !== 'number' || typeof payload.sub !== 'string')
      return null;
    return this.auth.loadSessionUser(payload);
  }
}
