import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import type { Request } from 'express';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { ENV, type Env } from '../config/env.js';
import { AuthService } from './auth.service.js';
import { SESSION_COOKIE, type SessionToken, type SessionUser } from './session-user.js';

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
    super({ jwtFromRequest: ExtractJwt.fromExtractors([fromSessionCookie]), secretOrKey: env.JWT_SECRET, ignoreExpiration: false });
  }

  /** Returning null makes passport answer 401: a deactivated or signed-out user's token stops working at once. */
  async validate(payload: SessionToken): Promise<SessionUser | null> {
    return this.auth.loadSessionUser(payload.sub, payload.iat ?? 0);
  }
}
