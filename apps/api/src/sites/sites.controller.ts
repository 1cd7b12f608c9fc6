import { Controller, Get, Param, ParseUUIDPipe, Query, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type SiteFile, TimelineQuery, type TimelineReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { SitesService } from './sites.service.js';

@Controller('sites')
export class SitesController {
  constructor(private readonly sites: SitesService) {}

  @Get(':id')
  @Allow('read', 'ImplantSite')
  siteFile(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
  ): Promise<SiteFile> {
    return this.sites.siteFile(ability, scopeOf(user), id);
  }

  @Get(':id/timeline')
  @Allow('read', 'ImplantSite')
  timeline(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
    @Query(new ZodValidationPipe(TimelineQuery)) query: TimelineQuery,
  ): Promise<TimelineReply> {
    return this.sites.timeline(ability, scopeOf(user), id, query.kinds, user.dateFormat);
  }
}
