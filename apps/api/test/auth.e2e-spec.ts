import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../src/seed/demo-scenario.js';
import { ACCOUNTS, signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

describe('sign-in', () => {
  it('sets an HttpOnly, SameSite=Strict session cookie and answers the user', async () => {
    const res = await ctx.http.post('/api/auth/sign-in').send({ email: ACCOUNTS.dentist, password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      email: ACCOUNTS.dentist,
      role: 'dentist',
      practiceName: 'Larkspur Lane Dental',
      sharedPatientIds: [],
      shares: [],
    });
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('tt_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\//);
    expect(res.body).not.toHaveProperty('passwordHash');
  });

  it('accepts the e-mail in any letter case', async () => {
    const res = await ctx.http
      .post('/api/auth/sign-in')
      .send({ email: ACCOUNTS.hygienist.toUpperCase(), password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
  });

  it('answers 401 with a plain message for a wrong password, the same as for an unknown e-mail', async () => {
    const wrong = await ctx.http
      .post('/api/auth/sign-in')
      .send({ email: ACCOUNTS.dentist, password: 'not-the-password' });
    const unknown = await ctx.http
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@larkspur.example', password: 'whatever' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.message).toBe('The e-mail or password is not right');
    expect(unknown.body.message).toBe(wrong.body.message);
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('answers 400 naming the field when the body breaks its contract', async () => {
    const res = await ctx.http.post('/api/auth/sign-in').send({ email: 'not-an-email', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('email');
    expect(res.body.fields).toHaveProperty('password');
    expect(res.body.message).toBe('2 entries need correcting');
    expect(res.body.fields.email).toBe('Enter a valid e-mail address');
    expect(res.body.fields.password).not.toMatch(/Too small|expected/);
  });

  it('throttles repeated attempts for one e-mail (429) without locking out another', async () => {
    const email = 'priya.sandhu@larkspur.example';
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      statuses.push((await ctx.http.post('/api/auth/sign-in').send({ email, password: 'guess-' + i })).status);
    }
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
    const other = await ctx.http
      .post('/api/auth/sign-in')
      .send({ email: ACCOUNTS.practice_admin, password: DEMO_PASSWORD });
    expect(other.status).toBe(200);
  });
});

describe('session', () => {
  it('answers /api/auth/me for a signed-in user and 401 without a cookie or with a forged one', async () => {
    const cookie = await signIn(ctx, 'surgeon');
    const me = await ctx.http.get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
    expect(me.body.role).toBe('surgeon');
    expect(me.body.sharedPatientIds).toHaveLength(4);
    expect((await ctx.http.get('/api/auth/me')).status).toBe(401);
    const forged = cookie.slice(0, -4) + 'AAAA';
    expect((await ctx.http.get('/api/auth/me').set('Cookie', forged)).status).toBe(401);
  });

  it('sign-out ends the session on the server: the old cookie no longer works, a new sign-in does', async () => {
    const cookie = await signIn(ctx, 'hygienist');
    expect((await ctx.http.get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
    // No wait for the next second: the session version ends a token issued in the sign-out's second.
    expect((await ctx.http.post('/api/auth/sign-out').set('Cookie', cookie)).status).toBe(204);
    const replay = await ctx.http.get('/api/auth/me').set('Cookie', cookie);
    expect(replay.status).toBe(401);
    const fresh = await signIn(ctx, 'hygienist');
    expect((await ctx.http.get('/api/auth/me').set('Cookie', fresh)).status).toBe(200);
  });

  it('sign-out clears the cookie', async () => {
    const res = await ctx.http.post('/api/auth/sign-out');
    expect(res.status).toBe(204);
    const cleared = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('tt_session='));
    expect(cleared).toMatch(/Expires=Thu, 01 Jan 1970/);
  });
});

describe('security headers', () => {
  it('sends a Content-Security-Policy that allows scripts only from our origin, and nosniff', async () => {
    const res = await ctx.http.get('/api/health');
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
    expect(res.headers['content-security-policy']).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('closed by default', () => {
  it('answers JSON 404 for an unknown route under /api', async () => {
    const res = await ctx.http.get('/api/no-such-route');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body).toMatchObject({ statusCode: 404, error: 'Not Found' });
  });
});
