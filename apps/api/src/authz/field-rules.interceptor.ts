import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { type AppAbility, readableFields, type Subject } from '@torquetrail/authz';
import type { Request } from 'express';
import { map, type Observable } from 'rxjs';
import { ABILITY_CHECK, type AbilityCheck } from './check-ability.decorator.js';

/**
 * Least privilege in the replies (issue 12), in ONE place every reply passes: the reply of a
 * route that reads a subject keeps only the fields the user's CASL field rules permit on it
 * (`permittedFieldsOf`). A rule without fields (every rule of one's own practice) keeps the reply
 * whole; a share's rules name the few fields a surgeon of another practice may read.
 */
@Injectable()
export class FieldRulesInterceptor implements NestInterceptor {
  constructor(private readonly reflector: Reflector) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const check = this.reflector.getAllAndOverride<AbilityCheck | undefined>(ABILITY_CHECK, [
      context.getHandler(),
      context.getClass(),
    ]);
    const ability = context.switchToHttp().getRequest<Request & { ability?: AppAbility }>().ability;
    if (!check || !('subject' in check) || check.action !== 'read' || !ability) return next.handle();
    return next.handle().pipe(map((reply: unknown) => keepPermitted(ability, check.subject, reply)));
  }
}

/** The reply, or a copy of it without the fields the ability does not let the user read. */
function keepPermitted(ability: AppAbility, type: Subject, reply: unknown): unknown {
  if (type === 'all' || !isRow(reply)) return reply;
  const fields = readableFields(ability, type, reply);
  if (fields === null) return reply;
  return Object.fromEntries(Object.entries(reply).filter(([key]) => fields.includes(key)));
}

/** A reply that is one row (it names its practice): lists and files are not redacted here. */
const isRow = (value: unknown): value is Record<string, unknown> & { practiceId: string } =>
  typeof value === 'object' &&
  value !== null &&
  !Array.isArray(value) &&
  typeof (value as { practiceId?: unknown }).practiceId === 'string';
