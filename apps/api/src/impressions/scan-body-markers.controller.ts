import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { ScanBodyMarkerBody, type ScanBodyMarker, type ScanBodyMarkerListReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ScanBodyMarkersService } from './scan-body-markers.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class ScanBodyMarkersController {
  constructor(private readonly markers: ScanBodyMarkersService) {}

  @Get('scan-files/:id/markers')
  @Allow('read', 'Impression')
  list(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<ScanBodyMarkerListReply> {
    return this.markers.list(ability, scopeOf(user), id);
  }

  @Post('scan-files/:id/markers')
  @Allow('create', 'Impression')
  save(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(ScanBodyMarkerBody)) body: z.output<typeof ScanBodyMarkerBody>,
  ): Promise<ScanBodyMarker> {
    return this.markers.save(ability, user, scopeOf(user), id, body);
  }
}
