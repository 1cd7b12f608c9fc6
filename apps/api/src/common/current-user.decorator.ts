import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { Request } from 'express';
import type { AppAbility } from '@torquetrail/authz';
import type { SessionUser } from '../auth/session-user.js';

export interface AuthedRequest extends Request {
  user: SessionUser;
  ability: AppAbility;
}

export const CurrentUser = createParamDecorator(
  (_: unknown, ctx: ExecutionContext) => ctx.switchToHttp().getRequest<AuthedRequest>().user,
);

export const CurrentAbility = createParamDecorator(
  (_: unknown, ctx: ExecutionContext) => ctx.switchToHttp().getRequest<AuthedRequest>().ability,
);
