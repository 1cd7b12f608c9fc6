import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { AppAbility } from '@torquetrail/authz';
import { map, type Observable } from 'rxjs';
import type { AuthedRequest } from '../common/current-user.decorator.js';
import { currentAudit } from '../common/audit-context.js';
import { ABILITY_CHECK, type AbilityCheck } from './check-ability.decorator.js';
import { leastPrivilege } from './least-privilege.js';

/**
 * Least privilege in the replies (issue 12), in ONE place every reply passes: the JSON reply of a
 * route that reads a subject keeps, of each part that belongs to a patient shared with the user,
 * only the fields the user's CASL field rules permit (`permittedFieldsOf`), and none of the rows
 * of a site or a day the share does not open (least-privilege.ts). Replies about the patients of
 * one's own practice pass whole: their rules name no fields.
 */
@Injectable()
export class FieldRulesInterceptor implements NestInterceptor {
  constructor(private readonly reflector: Reflector) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const check = this.reflector.getAllAndOverride<AbilityCheck | undefined>(ABILITY_CHECK, [
      context.getHandler(),
      context.getClass(),
    ]);
    const req = context.switchToHttp().getRequest<AuthedRequest & { ability?: AppAbility }>();
    const { ability, user } = req;
    if (!check || !('subject' in check) || check.action !== 'read' || check.subject === 'all') return next.handle();
    if (!ability || !user || user.shares.length === 0) return next.handle();
    const type = check.subject;
    return next.handle().pipe(
      map((reply: unknown) => {
        // The patient the request opened (assertCan noted it): the reply's rows belong to it
        // unless they name their own patient.
        const opened = currentAudit()?.opened.find((r) => r.patientId)?.patientId;
        return leastPrivilege(reply, { ability, shares: user.shares, type, openedPatientId: opened });
      }),
    );
  }
}
