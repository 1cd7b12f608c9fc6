import { Body, Controller, Get, HttpCode, Inject, Param, ParseUUIDPipe, Post, Put, Req } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  ChangeRoleBody,
  type Invitation,
  InviteBody,
  type PeopleReply,
  type Person,
  type PracticeContact,
  PracticeContactBody,
  SessionSettings,
} from '@torquetrail/contracts';
import type { Request } from 'express';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ENV, type Env } from '../config/env.js';
import { linkOrigin } from './link-origin.js';
import { PeopleService } from './people.service.js';

/** Practice → People, and the practice's sign-in settings (practice administrator). */
@Controller()
export class PeopleController {
  constructor(
    private readonly people: PeopleService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  @Get('people')
  @Allow('read', 'User')
  list(@CurrentUser() user: SessionUser): Promise<PeopleReply> {
    return this.people.list(user);
  }

  @Post('people/invitations')
  @Allow('create', 'User')
  invite(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(InviteBody)) body: InviteBody,
    @Req() req: Request,
  ): Promise<Invitation> {
    return this.people.invite(user, body.email, body.role, linkOrigin(this.env, req));
  }

  @Post('people/invitations/:id/resend')
  @HttpCode(200)
  @Allow('create', 'User')
  resend(
    @CurrentAbility() ability: AppAbility,
    @Param('id', ParseUUIDPipe) id: string,
    @Req() req: Request,
  ): Promise<Invitation> {
    return this.people.resend(ability, id, linkOrigin(this.env, req));
  }

  @Post('people/invitations/:id/revoke')
  @HttpCode(200)
  @Allow('update', 'User')
  revoke(
    @CurrentAbility() ability: AppAbility,
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<Invitation> {
    return this.people.revoke(ability, user, id);
  }

  @Put('people/:id/role')
  @Allow('update', 'User')
  changeRole(
    @CurrentAbility() ability: AppAbility,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(ChangeRoleBody)) body: ChangeRoleBody,
  ): Promise<Person> {
    return this.people.changeRole(ability, id, body.role);
  }

  @Post('people/:id/deactivation')
  @HttpCode(200)
  @Allow('update', 'User')
  deactivate(@CurrentAbility() ability: AppAbility, @Param('id', ParseUUIDPipe) id: string): Promise<Person> {
    return this.people.deactivate(ability, id);
  }

  @Get('practice/session-settings')
  @Allow('read', 'Practice')
  sessionSettings(@CurrentUser() user: SessionUser): Promise<SessionSettings> {
    return this.people.sessionSettings(user);
  }

  @Put('practice/session-settings')
  @Allow('update', 'Practice')
  setSessionSettings(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(SessionSettings)) body: SessionSettings,
  ): Promise<SessionSettings> {
    return this.people.setSessionSettings(user, body);
  }

  @Get('practice/contact')
  @Allow('read', 'Practice')
  contact(@CurrentUser() user: SessionUser): Promise<PracticeContact> {
    return this.people.contact(user);
  }

  @Put('practice/contact')
  @Allow('update', 'Practice')
  setContact(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(PracticeContactBody)) body: PracticeContactBody,
  ): Promise<PracticeContact> {
    return this.people.setContact(user, body);
  }
}
