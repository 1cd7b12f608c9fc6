import { type ExecutionContext, Injectable, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { IS_PUBLIC } from '../common/public.decorator.js';

/** Global: every route needs a valid session unless it is marked @Public(). */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override canActivate(context: ExecutionContext) {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, [context.getHandler(), context.getClass()]);
    if (isPublic) return true;
    return super.canActivate(context);
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
