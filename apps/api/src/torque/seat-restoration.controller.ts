import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type RestorationScrewsReply, SeatRestorationBody, type SeatRestorationReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { SeatRestorationService } from './seat-restoration.service.js';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller('restorations/:id')
export class SeatRestorationController {
  constructor(private readonly seating: SeatRestorationService) {}

  @Get('screws')
  @Allow('read', 'Restoration')
  screws(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid) id: string,
  ): Promise<RestorationScrewsReply> {
    return this.seating.screws(ability, scopeOf(user), id);
  }

  @Post('seat')
  @Allow('create', 'TorqueEvent')
  seat(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid) id: string,
    @Body(new ZodValidationPipe(SeatRestorationBody)) body: z.output<typeof SeatRestorationBody>,
  ): Promise<SeatRestorationReply> {
    return this.seating.seat(ability, user, scopeOf(user), id, body);
  }
}
