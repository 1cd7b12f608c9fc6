import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  SeatingAmendmentBody,
  SeatingCheckBody,
  type SeatingCheck,
  type SeatingCheckListReply,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { SeatingService } from './seating.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class SeatingController {
  constructor(private readonly seating: SeatingService) {}

  @Get('restorations/:id/seating-checks')
  @Allow('read', 'Restoration')
  list(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<SeatingCheckListReply> {
    return this.seating.list(ability, scopeOf(user), id);
  }

  /** A seating check is part of the restoration's record: only who may write restorations records it. */
  @Post('restorations/:id/seating-checks')
  @Allow('create', 'Restoration')
  record(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(SeatingCheckBody)) body: z.output<typeof SeatingCheckBody>,
  ): Promise<SeatingCheck> {
    return this.seating.record(ability, user, scopeOf(user), id, body);
  }

  @Post('seating-checks/:id/amendments')
  @Allow('amend', 'Restoration')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(SeatingAmendmentBody)) body: z.output<typeof SeatingAmendmentBody>,
  ): Promise<SeatingCheck> {
    return this.seating.amend(ability, user, scopeOf(user), id, body);
  }
}
