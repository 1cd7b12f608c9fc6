import { Controller, Get, HttpStatus, Param, ParseUUIDPipe } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { SiteBoneLevels } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { BoneLevelsService } from './bone-levels.service.js';

@Controller()
export class BoneLevelsController {
  constructor(private readonly boneLevels: BoneLevelsService) {}

  @Get('sites/:id/bone-levels')
  @Allow('read', 'Radiograph')
  forSite(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
  ): Promise<SiteBoneLevels> {
    return this.boneLevels.forSite(ability, scopeOf(user), id, user.dateFormat);
  }
}
