import { Injectable } from '@nestjs/common';
import { ThrottlerGuard } from '@nestjs/throttler';
import type { Request } from 'express';

/** Counts sign-in attempts per address and e-mail, so one busy front desk does not lock out the others. */
@Injectable()
export class SignInThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const request = req as unknown as Request;
    const email = typeof request.body?.email === 'string' ? request.body.email.toLowerCase() : '';
    return `${request.ip ?? 'unknown'}|${email}`;
  }
}
