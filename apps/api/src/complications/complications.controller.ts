import { Body, Controller, Param, ParseUUIDPipe, Post, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type Complication, ComplicationAmendmentBody, ComplicationBody } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ComplicationsService } from './complications.service.js';

@Controller('complications')
export class ComplicationsController {
  constructor(private readonly complications: ComplicationsService) {}

  @Post()
  @Allow('create', 'Complication')
  create(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(ComplicationBody)) body: z.output<typeof ComplicationBody>,
  ): Promise<Complication> {
    return this.complications.create(ability, user, scopeOf(user), body);
  }

  @Post(':id/amendments')
  @Allow('amend', 'Complication')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
    @Body(new ZodValidationPipe(ComplicationAmendmentBody)) body: z.output<typeof ComplicationAmendmentBody>,
  ): Promise<Complication> {
    return this.complications.amend(ability, user, scopeOf(user), id, body);
  }
}
