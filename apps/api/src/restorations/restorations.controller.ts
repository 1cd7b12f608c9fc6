import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Put, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  CantileverSettings,
  DeliveryBody,
  PlanAmendmentBody,
  PlanBody,
  type RestorableSitesReply,
  type RestorationDetail,
  type RestorationListReply,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { RestorationsService } from './restorations.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class RestorationsController {
  constructor(private readonly restorations: RestorationsService) {}

  @Get('practice/cantilever-settings')
  @Allow('read', 'Practice')
  cantileverSettings(@CurrentUser() user: SessionUser): Promise<CantileverSettings> {
    return this.restorations.cantileverSettings(scopeOf(user));
  }

  @Put('practice/cantilever-settings')
  @Allow('update', 'Practice')
  setCantileverSettings(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(CantileverSettings)) body: CantileverSettings,
  ): Promise<CantileverSettings> {
    return this.restorations.setCantileverSettings(scopeOf(user), body.cantileverRatioLimit);
  }

  @Get('patients/:id/restorable-sites')
  @Allow('read', 'ImplantSite')
  restorableSites(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<RestorableSitesReply> {
    return this.restorations.restorableSites(ability, scopeOf(user), id);
  }

  @Get('patients/:id/restorations')
  @Allow('read', 'Restoration')
  list(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<RestorationListReply> {
    return this.restorations.list(ability, scopeOf(user), id);
  }

  @Post('restorations')
  @Allow('create', 'Restoration')
  create(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(PlanBody)) body: z.output<typeof PlanBody>,
  ): Promise<RestorationDetail> {
    return this.restorations.create(ability, user, scopeOf(user), body);
  }

  @Get('restorations/:id')
  @Allow('read', 'Restoration')
  detail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<RestorationDetail> {
    return this.restorations.detail(ability, scopeOf(user), id);
  }

  @Post('restorations/:id/amendments')
  @Allow('amend', 'Restoration')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(PlanAmendmentBody)) body: z.output<typeof PlanAmendmentBody>,
  ): Promise<RestorationDetail> {
    return this.restorations.amend(ability, user, scopeOf(user), id, body);
  }

  @Post('restorations/:id/delivery')
  @HttpCode(200)
  @Allow('create', 'ComponentInstance')
  deliver(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(DeliveryBody)) body: z.output<typeof DeliveryBody>,
  ): Promise<RestorationDetail> {
    return this.restorations.deliver(ability, user, scopeOf(user), id, body);
  }
}
