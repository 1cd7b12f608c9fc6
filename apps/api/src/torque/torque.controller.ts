import { Body, Controller, Param, ParseUUIDPipe, Post, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { TorqueAmendmentBody, TorqueBody, type TorqueEvent } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { TorqueService } from './torque.service.js';

@Controller('torque-events')
export class TorqueController {
  constructor(private readonly torque: TorqueService) {}

  @Post()
  @Allow('create', 'TorqueEvent')
  log(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(TorqueBody)) body: z.output<typeof TorqueBody>,
  ): Promise<TorqueEvent> {
    return this.torque.log(ability, user, scopeOf(user), body);
  }

  @Post(':id/amendments')
  @Allow('amend', 'TorqueEvent')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
    @Body(new ZodValidationPipe(TorqueAmendmentBody)) body: z.output<typeof TorqueAmendmentBody>,
  ): Promise<TorqueEvent> {
    return this.torque.amend(ability, user, scopeOf(user), id, body);
  }
}
