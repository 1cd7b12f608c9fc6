import { Body, Controller, Get, HttpCode, Post, Req, Res, UseGuards } from '@nestjs/common';
import { Inject } from '@nestjs/common';
import type { Request, Response } from 'express';
import { type Me, SignInBody } from '@torquetrail/contracts';
import { ENV, type Env } from '../config/env.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { Public } from '../common/public.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { AuthService } from './auth.service.js';
import { SESSION_COOKIE, type SessionUser } from './session-user.js';
import { SignInThrottlerGuard } from './sign-in-throttler.guard.js';

const toMe = (user: SessionUser): Me => ({
  id: user.id,
  email: user.email,
  displayName: user.displayName,
  role: user.role,
  practiceId: user.practiceId,
  practiceName: user.practiceName,
  sharedPatientIds: user.sharedPatientIds,
});

@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  @Public()
  @Post('sign-in')
  @Audit('sign-in', 'User')
  @HttpCode(200)
  @UseGuards(SignInThrottlerGuard)
  async signIn(
    @Body(new ZodValidationPipe(SignInBody)) body: SignInBody,
    @Res({ passthrough: true }) res: Response,
  ): Promise<Me> {
    const { user, token } = await this.auth.signIn(body.email, body.password);
    res.cookie(SESSION_COOKIE, token, {
      httpOnly: true,
      sameSite: 'strict',
      secure: this.env.COOKIE_SECURE,
      path: '/',
      maxAge: this.env.SESSION_TTL_S * 1000,
    });
    return toMe(user);
  }

  @Public()
  @Post('sign-out')
  @Audit('sign-out', 'User')
  @HttpCode(204)
  async signOut(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.signOut((req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE]);
    res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'strict', secure: this.env.COOKIE_SECURE, path: '/' });
  }

  @Get('me')
  @Allow.signedIn()
  me(@CurrentUser() user: SessionUser): Me {
    return toMe(user);
  }
}
