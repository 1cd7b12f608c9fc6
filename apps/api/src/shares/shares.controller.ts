import { Body, Controller, Get, HttpCode, HttpStatus, Inject, Param, ParseUUIDPipe, Post, Req } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { CreateShareBody, RevokeShareBody, type Share, type ShareListReply } from '@torquetrail/contracts';
import type { Request } from 'express';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ENV, type Env } from '../config/env.js';
import { linkOrigin } from '../people/link-origin.js';
import { SharesService } from './shares.service.js';

const Id = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** Patient → Shares and Practice → Shares (dentist; the practice administrator reads). */
@Controller()
export class SharesController {
  constructor(
    private readonly shares: SharesService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  @Get('shares')
  @Allow('read', 'Share')
  list(@CurrentUser() user: SessionUser): Promise<ShareListReply> {
    return this.shares.listPractice(user);
  }

  @Get('patients/:id/shares')
  @Allow('read', 'Share')
  listPatient(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', Id) id: string,
  ): Promise<ShareListReply> {
    return this.shares.listPatient(ability, scopeOf(user), id);
  }

  @Post('patients/:id/shares')
  @Allow('create', 'Share')
  create(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', Id) id: string,
    @Body(new ZodValidationPipe(CreateShareBody)) body: z.output<typeof CreateShareBody>,
    @Req() req: Request,
  ): Promise<Share> {
    return this.shares.create(ability, user, scopeOf(user), id, body, linkOrigin(this.env, req));
  }

  @Post('shares/:id/revoke')
  @HttpCode(200)
  @Allow('update', 'Share')
  revoke(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', Id) id: string,
    @Body(new ZodValidationPipe(RevokeShareBody)) body: RevokeShareBody,
  ): Promise<Share> {
    return this.shares.revoke(ability, user, id, body);
  }
}
