import { Injectable } from '@nestjs/common';
import { ThrottlerGuard, type ThrottlerOptions } from '@nestjs/throttler';
import type { Request } from 'express';

const address = (req: Record<string, unknown>) => (req as unknown as Request).ip ?? 'unknown';
const email = (req: Record<string, unknown>) => {
  const body = (req as unknown as Request).body as { email?: unknown } | undefined;
  return typeof body?.email === 'string' ? body.email.toLowerCase() : '';
};

/**
 * Two limits on sign-in attempts: per address and e-mail (so one busy front desk does not lock
 * out its colleagues), and per address alone with a higher limit (so one address cannot try a
 * password against many e-mails).
 */
export function signInThrottlers(perAccount: number, perAddress: number): ThrottlerOptions[] {
  return [
    { name: 'account', ttl: 60_000, limit: perAccount, getTracker: (req) => `${address(req)}|${email(req)}` },
    { name: 'address', ttl: 60_000, limit: perAddress, getTracker: (req) => address(req) },
  ];
}

/** Only the sign-in route uses this guard; the throttlers are configured in AuthModule. */
@Injectable()
export class SignInThrottlerGuard extends ThrottlerGuard {}
