import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, Put } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  ImpressionAmendmentBody,
  ImpressionBody,
  ImpressionSettings,
  type Impression,
  type ImpressionListReply,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ImpressionsService } from './impressions.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class ImpressionsController {
  constructor(private readonly impressions: ImpressionsService) {}

  @Get('restorations/:id/impressions')
  @Allow('read', 'Impression')
  list(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<ImpressionListReply> {
    return this.impressions.list(ability, scopeOf(user), id);
  }

  @Post('restorations/:id/impressions')
  @Allow('create', 'Impression')
  record(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(ImpressionBody)) body: z.output<typeof ImpressionBody>,
  ): Promise<Impression> {
    return this.impressions.record(ability, user, scopeOf(user), id, body);
  }

  @Post('impressions/:id/amendments')
  @Allow('amend', 'Impression')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(ImpressionAmendmentBody)) body: z.output<typeof ImpressionAmendmentBody>,
  ): Promise<Impression> {
    return this.impressions.amend(ability, user, scopeOf(user), id, body);
  }

  @Get('practice/impression-settings')
  @Allow('read', 'Practice')
  settings(@CurrentUser() user: SessionUser): Promise<ImpressionSettings> {
    return this.impressions.settings(scopeOf(user));
  }

  @Put('practice/impression-settings')
  @Allow('update', 'Practice')
  setSettings(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(ImpressionSettings)) body: ImpressionSettings,
  ): Promise<ImpressionSettings> {
    return this.impressions.setSettings(scopeOf(user), body);
  }
}
