import { Body, Controller, Get, HttpCode, Inject, Post, Put, Req, Res, UseGuards } from '@nestjs/common';
import type { Request, Response } from 'express';
import { ChangePasswordBody, type Me, SignInBody } from '@torquetrail/contracts';
import { ENV, type Env } from '../config/env.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { Public } from '../common/public.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { AuthService } from './auth.service.js';
import { clearSessionCookie, setSessionCookie } from './session-cookie.js';
import { SESSION_COOKIE, type SessionUser } from './session-user.js';
import { SignInThrottlerGuard } from './sign-in-throttler.guard.js';

@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  private toMe(user: SessionUser): Me {
    return {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      role: user.role,
      practiceId: user.practiceId,
      practiceName: user.practiceName,
      dateFormat: user.dateFormat,
      sharedPatientIds: user.sharedPatientIds,
      shares: user.shares.map((s) => ({
        patientId: s.patientId,
        scopes: [...s.scopes],
        siteIds: s.siteIds && [...s.siteIds],
      })),
      session: this.auth.sessionInfo(user),
    };
  }

  @Public()
  @Post('sign-in')
  @Audit('sign-in', 'User')
  @HttpCode(200)
  @UseGuards(SignInThrottlerGuard)
  async signIn(
    @Body(new ZodValidationPipe(SignInBody)) body: SignInBody,
    @Res({ passthrough: true }) res: Response,
  ): Promise<Me> {
    const { user, token, lifetimeS } = await this.auth.signIn(body.email, body.password);
    setSessionCookie(res, this.env, token, lifetimeS);
    return this.toMe(user);
  }

  @Public()
  @Post('sign-out')
  @Audit('sign-out', 'User')
  @HttpCode(204)
  async signOut(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.signOut((req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE]);
    clearSessionCookie(res, this.env);
  }

  @Get('me')
  @Allow.signedIn()
  me(@CurrentUser() user: SessionUser): Me {
    return this.toMe(user);
  }

  /** Everyone changes their own password; this session goes on with a new cookie, the others end. */
  @Put('password')
  @HttpCode(204)
  @Allow.signedIn()
  @UseGuards(SignInThrottlerGuard)
  async changePassword(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(ChangePasswordBody)) body: ChangePasswordBody,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    const { token, lifetimeS } = await this.auth.changePassword(user, body.currentPassword, body.newPassword);
    setSessionCookie(res, this.env, token, lifetimeS);
  }
}
