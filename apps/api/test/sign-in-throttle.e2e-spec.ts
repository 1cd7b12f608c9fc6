// Sign-in throttling per address, as counted behind a trusted proxy. Its own file: the app here
// trusts the loopback proxy (TRUST_PROXY=loopback), so the test can speak from a documentation
// address (RFC 5737) of its own and leave the loopback address's allowance alone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../src/seed/demo-scenario.js';
import { ACCOUNTS, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp({ TRUST_PROXY: 'loopback' });
});
afterAll(() => ctx.close());

describe('sign-in throttle per address', () => {
  it('limits one address trying many e-mails (429), whatever the e-mail', async () => {
    const address = '203.0.113.7';
    const statuses: number[] = [];
    for (let i = 0; i < 70 && !statuses.includes(429); i++) {
      statuses.push(
        (
          await ctx.http
            .post('/api/auth/sign-in')
            .set('X-Forwarded-For', address)
            .send({ email: `guess-${i}@larkspur.example`, password: 'x' })
        ).status,
      );
    }
    expect(statuses[0]).toBe(401);
    expect(statuses.at(-1)).toBe(429);
    // Default 60 per minute per address: the 61st attempt from this address is the first refused.
    expect(statuses.length).toBe(61);
    // The loopback address keeps its own allowance.
    expect(
      (await ctx.http.post('/api/auth/sign-in').send({ email: ACCOUNTS.practice_admin, password: DEMO_PASSWORD }))
        .status,
    ).toBe(200);
  });
});
