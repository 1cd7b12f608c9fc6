import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, Put } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  type InsertChange,
  InsertChangeAmendmentBody,
  InsertChangeBody,
  InsertReviewSettings,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { InsertChangesService } from './insert-changes.service.js';

@Controller()
export class InsertChangesController {
  constructor(private readonly changes: InsertChangesService) {}

  @Post('insert-changes')
  @Allow('create', 'InsertChange')
  create(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(InsertChangeBody)) body: z.output<typeof InsertChangeBody>,
  ): Promise<InsertChange> {
    return this.changes.create(ability, user, scopeOf(user), body);
  }

  @Post('insert-changes/:id/amendments')
  @Allow('amend', 'InsertChange')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
    @Body(new ZodValidationPipe(InsertChangeAmendmentBody)) body: z.output<typeof InsertChangeAmendmentBody>,
  ): Promise<InsertChange> {
    return this.changes.amend(ability, user, scopeOf(user), id, body);
  }

  @Get('practice/insert-review-settings')
  @Allow('read', 'Practice')
  settings(@CurrentUser() user: SessionUser): Promise<InsertReviewSettings> {
    return this.changes.settings(scopeOf(user));
  }

  @Put('practice/insert-review-settings')
  @Allow('update', 'Practice')
  setSettings(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(InsertReviewSettings)) body: InsertReviewSettings,
  ): Promise<InsertReviewSettings> {
    return this.changes.setSettings(scopeOf(user), body.insertReviewIntervalMonths);
  }
}
