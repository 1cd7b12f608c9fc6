import { Body, Controller, HttpCode, Inject, Post, Req, UseGuards } from '@nestjs/common';
import {
  AcceptInvitationBody,
  CompletePasswordResetBody,
  type InvitationPreview,
  LinkTokenBody,
  type PasswordResetPreview,
  PasswordResetRequestBody,
  type PasswordResetRequestReply,
} from '@torquetrail/contracts';
import type { Request } from 'express';
import { SignInThrottlerGuard } from '../auth/sign-in-throttler.guard.js';
import { Public } from '../common/public.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ENV, type Env } from '../config/env.js';
import { AccountService } from './account.service.js';
import { linkOrigin } from './link-origin.js';

/**
 * The public pages' routes: an invitation link and a password reset. Tokens travel in bodies,
 * never in paths, so they stay out of access logs; guessing is throttled like sign-in.
 */
@Controller('account')
@Public()
@UseGuards(SignInThrottlerGuard)
export class AccountController {
  constructor(
    private readonly accounts: AccountService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  @Post('invitation')
  @HttpCode(200)
  previewInvitation(@Body(new ZodValidationPipe(LinkTokenBody)) body: LinkTokenBody): Promise<InvitationPreview> {
    return this.accounts.previewInvitation(body.token);
  }

  @Post('invitation/accept')
  @HttpCode(204)
  acceptInvitation(@Body(new ZodValidationPipe(AcceptInvitationBody)) body: AcceptInvitationBody): Promise<void> {
    return this.accounts.acceptInvitation(body.token, body);
  }

  @Post('password-reset')
  @HttpCode(200)
  requestReset(
    @Body(new ZodValidationPipe(PasswordResetRequestBody)) body: PasswordResetRequestBody,
    @Req() req: Request,
  ): Promise<PasswordResetRequestReply> {
    return this.accounts.requestReset(body.email.toLowerCase(), linkOrigin(this.env, req));
  }

  @Post('password-reset/look-up')
  @HttpCode(200)
  previewReset(@Body(new ZodValidationPipe(LinkTokenBody)) body: LinkTokenBody): Promise<PasswordResetPreview> {
    return this.accounts.previewReset(body.token);
  }

  @Post('password-reset/complete')
  @HttpCode(204)
  completeReset(
    @Body(new ZodValidationPipe(CompletePasswordResetBody)) body: CompletePasswordResetBody,
  ): Promise<void> {
    return this.accounts.completeReset(body.token, body.password);
  }
}
