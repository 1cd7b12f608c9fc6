import { type ExecutionContext, Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import type { Response } from 'express';
import type { AuthedRequest } from '../common/current-user.decorator.js';
import { IS_PUBLIC } from '../common/public.decorator.js';
import { ENV, type Env } from '../config/env.js';
import { AuthService } from './auth.service.js';
import { setSessionCookie } from './session-cookie.js';

/**
 * Global: every route needs a valid session unless it is marked @Public(). A session in use gets
 * a fresh token every few minutes (sliding, up to the absolute session length), so an 8-hour
 * token lifetime never cuts a working session short and an idle copy of an old cookie expires.
 */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(
    private readonly reflector: Reflector,
    private readonly auth: AuthService,
    @Inject(ENV) private readonly env: Env,
  ) {
    super();
  }

  override async canActivate(context: ExecutionContext): Promise<boolean> {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, [context.getHandler(), context.getClass()]);
    if (isPublic) return true;
    const ok = (await super.canActivate(context)) as boolean;
    const http = context.switchToHttp();
    const renewed = await this.auth.renewIfOld(http.getRequest<AuthedRequest>().user);
    if (renewed) setSessionCookie(http.getResponse<Response>(), this.env, renewed.token, renewed.lifetimeS);
    return ok;
  }

  /**
   * passport-jwt reports a bad, expired or forged token as a failure (no user) and an error
   * thrown while loading the user (the database away) as `error`: that one is rethrown for the
   * exception filter (503), because answering 401 would sign the person out for nothing.
   */
  override handleRequest<TUser>(error: unknown, user: TUser | false): TUser {
    if (error) throw error;
    if (!user) throw new UnauthorizedException('Sign in to continue');
    return user;
  }
}
