import type { Response } from 'express';
import type { Env } from '../config/env.js';
import { SESSION_COOKIE } from './session-user.js';

/** Sets the session cookie (HttpOnly, SameSite=Strict: ADR 0001) to live as long as its token. */
export function setSessionCookie(res: Response, env: Env, token: string, lifetimeS: number): void {
  res.cookie(SESSION_COOKIE, token, {
    httpOnly: true,
    sameSite: 'strict',
    secure: env.COOKIE_SECURE,
    path: '/',
    maxAge: lifetimeS * 1000,
  });
}

export function clearSessionCookie(res: Response, env: Env): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'strict', secure: env.COOKIE_SECURE, path: '/' });
}
