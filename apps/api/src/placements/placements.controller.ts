import { Body, Controller, Get, Param, ParseUUIDPipe, Post, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  AddSiteBody,
  type ArchSite,
  PlacementAmendmentBody,
  PlacementBody,
  type PlacementOptionsReply,
  type PlacementRecord,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { PlacementsService } from './placements.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class PlacementsController {
  constructor(private readonly placements: PlacementsService) {}

  @Post('patients/:id/sites')
  @Allow('create', 'ImplantSite')
  addSite(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(AddSiteBody)) body: z.output<typeof AddSiteBody>,
  ): Promise<ArchSite> {
    return this.placements.addSite(ability, scopeOf(user), id, body);
  }

  @Get('sites/:id/placement-options')
  @Allow('create', 'Placement')
  options(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<PlacementOptionsReply> {
    return this.placements.placementOptions(ability, scopeOf(user), id);
  }

  @Post('sites/:id/placements')
  @Allow('create', 'Placement')
  record(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(PlacementBody)) body: z.output<typeof PlacementBody>,
  ): Promise<PlacementRecord> {
    return this.placements.record(ability, user, scopeOf(user), id, body);
  }

  @Post('placements/:id/amendments')
  @Allow('amend', 'Placement')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(PlacementAmendmentBody)) body: z.output<typeof PlacementAmendmentBody>,
  ): Promise<PlacementRecord> {
    return this.placements.amend(ability, user, scopeOf(user), id, body);
  }
}
