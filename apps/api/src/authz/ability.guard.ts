import { type CanActivate, type ExecutionContext, ForbiddenException, Injectable, Logger } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { AuthedRequest } from '../common/current-user.decorator.js';
import { IS_PUBLIC } from '../common/public.decorator.js';
import { AuditRecorder } from '../audit/audit-recorder.js';
import { AbilityCache } from './ability-cache.js';
import { ABILITY_CHECK, type AbilityCheck } from './check-ability.decorator.js';

/**
 * Global, after the JWT guard: gives the request the CASL ability of the signed-in user as loaded
 * for this request (kept while role, practice and shares are the same: ability-cache.ts) and
 * checks the route's action on its subject type. Row-level checks happen in the services. A
 * refusal of an audited route is recorded (audit/audit-recorder.ts).
 */
@Injectable()
export class AbilityGuard implements CanActivate {
  private readonly logger = new Logger('AbilityGuard');
  private readonly abilities = new AbilityCache();

  constructor(
    private readonly reflector: Reflector,
    private readonly audit: AuditRecorder,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const check = this.reflector.getAllAndOverride<AbilityCheck | undefined>(ABILITY_CHECK, targets);
    const req = context.switchToHttp().getRequest<AuthedRequest>();
    if (!check) {
      this.logger.error(`${req.method} ${req.path} has no @Allow(...) check: refused`);
      throw new ForbiddenException('This route is closed');
    }
    req.ability = this.abilities.abilityFor(req.user);
    if ('signedInOnly' in check) return true;
    if (!req.ability.can(check.action, check.subject)) {
      const refusal = new ForbiddenException('Your role may not do this');
      // Refused before any interceptor runs, so the refusal's audit row is written here.
      const audit = this.audit.open(context);
      if (audit) await this.audit.refused(audit, refusal);
      throw refusal;
    }
    return true;
  }
}
