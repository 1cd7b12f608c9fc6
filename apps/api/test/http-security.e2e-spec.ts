// Request-level defences: pinned session tokens, cross-site writes refused (OWASP CSRF Prevention
// Cheat Sheet: origin verification and JSON-only bodies beside SameSite cookies), proxy headers
// believed only when configured, and the security and caching headers of every reply.
import { createHmac } from 'node:crypto';
import { JwtService } from '@nestjs/jwt';
import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { complications, users } from '../src/db/schema/index.js';
import { siteId, signIn, startTestApp, testEnv, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let dentistId: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  const me = await ctx.http.get('/api/auth/me').set('Cookie', dentist);
  dentistId = me.body.id;
});
afterAll(() => ctx.close());

const complicationCount = async () => (await ctx.db.select({ n: count() }).from(complications))[0].n;
// Supertest listens on a new port for each request, so the tests name the host the browser used.
const HOST = 'torquetrail.test';
const OWN_ORIGIN = `http://${HOST}`;

/** A JWT signed with HMAC-SHA-256 by hand (node:crypto), so the claims are exactly the test's. */
function hs256(payload: Record<string, unknown>, secret: string): string {
  const part = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url');
  const body = `${part({ alg: 'HS256', typ: 'JWT' })}.${part(payload)}`;
  return `${body}.${createHmac('sha256', secret).update(body).digest('base64url')}`;
}

describe('session tokens signed with the app secret', () => {
  const secret = () => testEnv().JWT_SECRET;
  const call = (token: string) => ctx.http.get('/api/auth/me').set('Cookie', `tt_session=${token}`);
  /** The claims a session needs besides the times: the user's current session version and the sign-in time. */
  const session = async () => {
    const [{ sv }] = await ctx.db.select({ sv: users.sessionVersion }).from(users).where(eq(users.id, dentistId));
    return { sub: dentistId, sv, at: Math.floor(Date.now() / 1000) };
  };

  it('accepts a token as the app signs it (HS256 with iat and exp): the control case', async () => {
    const token = ctx.app.get(JwtService).sign(await session());
    expect((await call(token)).status).toBe(200);
  });

  it('refuses a token in another algorithm (HS512) though signed with the right secret', async () => {
    const token = ctx.app
      .get(JwtService)
      .sign(await session(), { secret: secret(), algorithm: 'HS512', expiresIn: 600 });
    expect((await call(token)).status).toBe(401);
  });

  it('refuses a token without an expiry, and one without an issue time', async () => {
    const now = Math.floor(Date.now() / 1000);
    const claims = await session();
    expect((await call(hs256({ ...claims, iat: now, exp: now + 600 }, secret()))).status).toBe(200);
    expect((await call(hs256({ ...claims, iat: now }, secret()))).status).toBe(401);
    expect((await call(hs256({ ...claims, exp: now + 600 }, secret()))).status).toBe(401);
  });
});

describe('cross-site writes', () => {
  it('refuses a form-encoded POST from another origin and writes nothing', async () => {
    const site = await siteId(ctx.db, 'LL-1005', 15);
    const before = await complicationCount();
    const res = await ctx.http
      .post('/api/complications')
      .set('Cookie', dentist)
      .set('Origin', 'http://evil.example')
      .type('form')
      .send({ siteId: site, kind: 'other', occurredOn: '2026-11-01' });
    expect(res.status).toBe(403);
    expect(res.body).toMatchObject({ statusCode: 403, message: 'This request came from another site and was refused' });
    expect(await complicationCount()).toBe(before);
  });

  it('refuses a JSON POST whose Origin is another site, and one whose Referer is (when Origin is absent)', async () => {
    const evilOrigin = await ctx.http
      .post('/api/auth/sign-out')
      .set('Cookie', dentist)
      .set('Origin', 'https://evil.example')
      .send({});
    expect(evilOrigin.status).toBe(403);
    const evilReferer = await ctx.http
      .post('/api/recalls/reminders/run')
      .set('Cookie', dentist)
      .set('Referer', 'https://evil.example/page')
      .send({});
    expect(evilReferer.status).toBe(403);
    const nullOrigin = await ctx.http.post('/api/auth/sign-out').set('Cookie', dentist).set('Origin', 'null').send({});
    expect(nullOrigin.status).toBe(403);
  });

  it('refuses a same-origin body that is not JSON (415): a form cannot forge a JSON request', async () => {
    const site = await siteId(ctx.db, 'LL-1005', 15);
    const before = await complicationCount();
    const res = await ctx.http
      .post('/api/complications')
      .set('Cookie', dentist)
      .set('Host', HOST)
      .set('Origin', OWN_ORIGIN)
      .set('Content-Type', 'text/plain')
      .send(JSON.stringify({ siteId: site, kind: 'other', occurredOn: '2026-11-01' }));
    expect(res.status).toBe(415);
    expect(await complicationCount()).toBe(before);
  });

  it('lets the app’s own origin through', async () => {
    const site = await siteId(ctx.db, 'LL-1005', 15);
    const res = await ctx.http
      .post('/api/complications')
      .set('Cookie', dentist)
      .set('Host', HOST)
      .set('Origin', OWN_ORIGIN)
      .send({ siteId: site, kind: 'other', occurredOn: '2026-11-01', notes: 'own origin' });
    expect(res.status).toBe(201);
  });
});

describe('proxy headers', () => {
  it('ignores a made-up X-Forwarded-For: sign-in throttling still counts the real address', async () => {
    const email = 'throttle-probe@larkspur.example';
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      const res = await ctx.http
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `203.0.113.${i}`)
        .send({ email, password: 'wrong' });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });
});

describe('reply headers', () => {
  it('every reply with patient data is no-store, without an ETag', async () => {
    for (const path of ['/api/patients', '/api/recalls/desk', '/api/recalls/desk/csv']) {
      const res = await ctx.http.get(path).set('Cookie', dentist);
      expect(res.status, path).toBe(200);
      expect(res.headers['cache-control'], path).toBe('no-store');
      expect(res.headers.etag, path).toBeUndefined();
    }
  });

  it('sends the security headers from helmet on API and web replies alike', async () => {
    const res = await ctx.http.get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
    expect(res.headers['content-security-policy']).toContain("frame-ancestors 'none'");
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
