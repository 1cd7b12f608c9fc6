// Practice → People over real HTTP, with invitation mail through pg-boss to the real SMTP catcher:
// the round trip (invite, read the caught mail, follow the link, set a password, sign in), single
// use, re-send, withdrawal, expiry and forged links; roles and the last active administrator;
// deactivation ending every session at once.
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitations, users } from '../src/db/schema/index.js';
import { ACCOUNTS, signIn, startTestApp, type TestContext } from './support/test-app.js';
import { freshEmail, linkMailedTo, signInAs, throwawayAccount } from './support/people.js';

process.env.REMINDER_RETRY_DELAY_S = '1';
let ctx: TestContext;
let admin: string;

beforeAll(async () => {
  ctx = await startTestApp();
  admin = await signIn(ctx, 'practice_admin');
});
afterAll(() => ctx.close());

const invite = (email: string, role = 'hygienist') =>
  ctx.http.post('/api/people/invitations').set('Cookie', admin).send({ email, role });
const preview = (token: string) => ctx.http.post('/api/account/invitation').send({ token });
const accept = (token: string, password: string, displayName = 'Wren Castellan') =>
  ctx.http.post('/api/account/invitation/accept').send({ token, displayName, password });

describe('an invitation', () => {
  it(
    'is mailed with a one-time link valid 72 h; the invitee sets a name and password and signs in; the link then is used up',
    { timeout: 60_000 },
    async () => {
      const email = freshEmail('wren.castellan');
      const res = await invite(email.toUpperCase());
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ email, role: 'hygienist', status: 'pending', invitedByName: 'Odile Park' });

      const { mail, page, token } = await linkMailedTo(email);
      expect(page).toBe('welcome');
      expect(mail.subject).toBe('Your invitation to Larkspur Lane Dental on Torquetrail');
      // 256 random bits; only the sha-256 is stored.
      expect(token).toHaveLength(43);
      const [row] = await ctx.db.select().from(invitations).where(eq(invitations.email, email));
      expect(row.tokenHash).toBe(createHash('sha256').update(token).digest('base64url'));
      expect(JSON.stringify(row)).not.toContain(token);
      const validH = (row.expiresAt!.getTime() - row.mailSentAt!.getTime()) / 3_600_000;
      expect(validH).toBeCloseTo(72, 1);

      const seen = await preview(token);
      expect(seen.status).toBe(200);
      expect(seen.body).toMatchObject({ email, role: 'hygienist', practiceName: 'Larkspur Lane Dental' });

      // The password rule, with plain messages at the field.
      for (const [password, message] of [
        ['short-one', /at least 12 characters/],
        ['Password2024!!', /most commonly used/],
        ['qwertyuiopqwertyuiop', /most commonly used/],
        [`${email.split('@')[0]}-x`, /part of your e-mail address/],
      ] as const) {
        const weak = await accept(token, password);
        expect(weak.status, password).toBe(400);
        expect(weak.body.fields.password, password).toMatch(message);
      }
      expect((await accept(token, 'Tidewater lantern 49')).status).toBe(204);

      const session = await signInAs(ctx, email, 'Tidewater lantern 49');
      const me = await ctx.http.get('/api/auth/me').set('Cookie', session);
      expect(me.body).toMatchObject({ email, displayName: 'Wren Castellan', role: 'hygienist' });

      const again = await accept(token, 'Another fine phrase 77');
      expect(again.status).toBe(410);
      expect(again.body.message).toMatch(/used already/);
      expect((await preview(token)).status).toBe(410);

      const people = await ctx.http.get('/api/people').set('Cookie', admin);
      expect(people.body.people).toContainEqual(expect.objectContaining({ email, active: true }));
      expect(people.body.invitations).toContainEqual(expect.objectContaining({ email, status: 'accepted' }));
    },
  );

  it(
    'sent again gets a new link and the old one stops working; withdrawn, its link is refused plainly',
    {
      timeout: 60_000,
    },
    async () => {
      const email = freshEmail('ossian.vale');
      const { id } = (await invite(email, 'dentist')).body as { id: string };
      const first = await linkMailedTo(email, 1);
      const resent = await ctx.http.post(`/api/people/invitations/${id}/resend`).set('Cookie', admin);
      expect(resent.status).toBe(200);
      const second = await linkMailedTo(email, 2);
      expect(second.token).not.toBe(first.token);
      expect((await preview(first.token)).status).toBe(404);
      expect((await preview(second.token)).status).toBe(200);

      const revoked = await ctx.http.post(`/api/people/invitations/${id}/revoke`).set('Cookie', admin);
      expect(revoked.body.status).toBe('revoked');
      const refused = await accept(second.token, 'Tidewater lantern 49');
      expect(refused.status).toBe(410);
      expect(refused.body.message).toBe('This invitation was withdrawn by the practice');
      expect((await ctx.http.post(`/api/people/invitations/${id}/resend`).set('Cookie', admin)).status).toBe(409);
    },
  );

  it('expired, forged or malformed: a plain refusal, never a server error', { timeout: 60_000 }, async () => {
    const email = freshEmail('linnea.roth');
    const { id } = (await invite(email)).body as { id: string };
    const { token } = await linkMailedTo(email);
    await ctx.db
      .update(invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(invitations.id, id));
    const expired = await accept(token, 'Tidewater lantern 49');
    expect(expired.status).toBe(410);
    expect(expired.body.message).toMatch(/expired: ask your practice administrator/);
    const listed = await ctx.http.get('/api/people').set('Cookie', admin);
    expect(listed.body.invitations).toContainEqual(expect.objectContaining({ id, status: 'expired' }));

    const forged = await preview('A'.repeat(43));
    expect(forged.status).toBe(404);
    expect(forged.body.message).toMatch(/^No such link/);
    const malformed = await preview('not-a-token');
    expect(malformed.status).toBe(400);
    expect(malformed.body.fields.token).toMatch(/not valid/);
  });

  it('is refused for an address that has an account or an open invitation already (409)', async () => {
    expect((await invite(ACCOUNTS.hygienist)).status).toBe(409);
    const email = freshEmail('tamsin.hale');
    expect((await invite(email)).status).toBe(201);
    const twice = await invite(email, 'dentist');
    expect(twice.status).toBe(409);
    expect(twice.body.message).toMatch(/already invited/);
  });
});

describe('roles and deactivation', () => {
  it('the last active administrator is neither demoted nor deactivated (409 in plain words)', async () => {
    const [odile] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.practice_admin));
    const demote = await ctx.http.put(`/api/people/${odile.id}/role`).set('Cookie', admin).send({ role: 'dentist' });
    expect(demote.status).toBe(409);
    expect(demote.body.message).toMatch(/only active administrator/);
    const off = await ctx.http.post(`/api/people/${odile.id}/deactivation`).set('Cookie', admin);
    expect(off.status).toBe(409);
    // With a second administrator, one of the two may go.
    const second = await throwawayAccount(ctx, 'practice_admin');
    const ok = await ctx.http.put(`/api/people/${second.id}/role`).set('Cookie', admin).send({ role: 'dentist' });
    expect(ok.status).toBe(200);
    expect(ok.body.role).toBe('dentist');
  });

  it('deactivation ends every session of the user at once; the row (and name) stays', async () => {
    const person = await throwawayAccount(ctx, 'dentist');
    const one = await signInAs(ctx, person.email);
    const two = await signInAs(ctx, person.email);
    expect((await ctx.http.get('/api/auth/me').set('Cookie', one)).status).toBe(200);
    const res = await ctx.http.post(`/api/people/${person.id}/deactivation`).set('Cookie', admin);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: person.id, active: false });
    expect((await ctx.http.get('/api/auth/me').set('Cookie', one)).status).toBe(401);
    expect((await ctx.http.get('/api/auth/me').set('Cookie', two)).status).toBe(401);
    expect(
      (await ctx.http.post('/api/auth/sign-in').send({ email: person.email, password: 'ledger-demo-2026' })).status,
    ).toBe(401);
    const listed = await ctx.http.get('/api/people').set('Cookie', admin);
    expect(listed.body.people).toContainEqual(
      expect.objectContaining({ id: person.id, displayName: res.body.displayName, active: false }),
    );
  });

  it("another practice's user is a 404 for the administrator; a non-administrator is refused (403)", async () => {
    const [nell] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.otherPracticeDentist));
    const res = await ctx.http.put(`/api/people/${nell.id}/role`).set('Cookie', admin).send({ role: 'hygienist' });
    expect(res.status).toBe(404);
    const dentist = await signIn(ctx, 'dentist');
    const [maren] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.hygienist));
    const refused = await ctx.http.put(`/api/people/${maren.id}/role`).set('Cookie', dentist).send({ role: 'dentist' });
    expect(refused.status).toBe(403);
  });
});

describe('the practice sign-in settings', () => {
  it('the administrator sets the idle sign-out period; every user of the practice gets it with the warning', async () => {
    const res = await ctx.http
      .put('/api/practice/session-settings')
      .set('Cookie', admin)
      .send({ idleSignOutMinutes: 30, dateFormat: 'day-month-year' });
    expect(res.status).toBe(200);
    const hygienist = await signIn(ctx, 'hygienist');
    const me = await ctx.http.get('/api/auth/me').set('Cookie', hygienist);
    expect(me.body.session).toMatchObject({ idleSignOutS: 1800, warnBeforeS: 60 });
    const bad = await ctx.http
      .put('/api/practice/session-settings')
      .set('Cookie', admin)
      .send({ idleSignOutMinutes: 1, dateFormat: 'day-month-year' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.idleSignOutMinutes).toMatch(/2 to 120 minutes/);
    await ctx.http
      .put('/api/practice/session-settings')
      .set('Cookie', admin)
      .send({ idleSignOutMinutes: 15, dateFormat: 'day-month-year' });
  });
});
