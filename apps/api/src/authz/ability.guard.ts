import { type CanActivate, type ExecutionContext, ForbiddenException, Injectable, Logger } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { defineAbilityFor } from '@torquetrail/authz';
import type { AuthedRequest } from '../common/current-user.decorator.js';
import { IS_PUBLIC } from '../common/public.decorator.js';
import { ABILITY_CHECK, type AbilityCheck } from './check-ability.decorator.js';

/**
 * Global, after the JWT guard: builds the CASL ability of the signed-in user once per request
 * and checks the route's action on its subject type. Row-level checks happen in the services.
 */
@Injectable()
export class AbilityGuard implements CanActivate {
  private readonly logger = new Logger('AbilityGuard');

  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const check = this.reflector.getAllAndOverride<AbilityCheck | undefined>(ABILITY_CHECK, targets);
    const req = context.switchToHttp().getRequest<AuthedRequest>();
    if (!check) {
      this.logger.error(`${req.method} ${req.path} has no @Allow(...) check: refused`);
      throw new ForbiddenException('This route is closed');
    }
    req.ability = defineAbilityFor(req.user);
    if ('signedInOnly' in check) return true;
    if (!req.ability.can(check.action, check.subject)) {
      throw new ForbiddenException('Your role may not do this');
    }
    return true;
  }
}
