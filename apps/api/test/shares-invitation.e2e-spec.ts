// Sharing with a surgeon new to Torquetrail (issue 12, item 1): the address has no account, so the
// share waits ("invited") on a one-time invitation mailed through the job queue; the surgeon signs
// up with a practice of their own and the share opens for them at once, audited in the sharing
// practice's trail. The share is revocable while it waits and ends with the invitation.
import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import type { Share } from '@torquetrail/contracts';
import { invitations, patientShares, practices, shareNotices, users } from '../src/db/schema/index.js';
import { freshEmail, linkMailedTo, mailsTo, signInAs } from './support/people.js';
import { signInAll, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);
const PASSWORD = 'Harbour lantern 58';

async function patientWithTwoSites(familyName: string) {
  const patient = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookies.dentist)
    .send({ givenName: 'Ottilie', familyName, birthDate: '1971-09-03' });
  expect(patient.status).toBe(201);
  const site = async (fdi: number) =>
    (await ctx.http.post(`/api/patients/${patient.body.id}/sites`).set('Cookie', cookies.dentist).send({ fdi })).body
      .id as string;
  return { id: patient.body.id as string, s36: await site(36), s46: await site(46) };
}

const share = (patientId: string, surgeonEmail: string, siteIds: string[] | null = null) =>
  ctx.http
    .post(`/api/patients/${patientId}/shares`)
    .set('Cookie', cookies.dentist)
    .send({ surgeonEmail, scopes: ['outcomes'], siteIds, endsOn: null, reason: 'Referred for the implant at 36' });
const sharesOf = async (patientId: string) =>
  (await ctx.http.get(`/api/patients/${patientId}/shares`).set('Cookie', cookies.dentist)).body.items as Share[];
const preview = (token: string) => ctx.http.post('/api/account/invitation').send({ token });
const accept = (token: string, practiceName?: string) =>
  ctx.http
    .post('/api/account/invitation/accept')
    .send({ token, displayName: 'Dr Maren Holloway', password: PASSWORD, practiceName });

describe('sharing with an address that has no account', () => {
  it(
    'invites the surgeon; on sign-up with a practice of their own the shared sites open to them, audited',
    { timeout: 90_000 },
    async () => {
      const email = freshEmail('maren.holloway', 'harbourline.example');
      const p = await patientWithTwoSites('Invitewell');
      const q = await patientWithTwoSites('Secondshare');
      const created = await share(p.id, email.toUpperCase(), [p.s36]);
      expect(created.status).toBe(201);
      const first = created.body as Share;
      expect(first).toMatchObject({
        status: 'invited',
        surgeon: { id: null, displayName: null, email, practiceName: null },
        sites: [{ id: p.s36, fdi: 36 }],
      });
      // A second patient for the same address waits on the same invitation: one mail, not two.
      expect((await share(q.id, email)).status).toBe(201);
      const [row] = await ctx.db.select().from(patientShares).where(eq(patientShares.id, first.id));
      const both = await ctx.db.select().from(patientShares).where(eq(patientShares.invitationId, row.invitationId!));
      expect(both.map((s) => s.patientId).sort()).toEqual([p.id, q.id].sort());
      expect(both.every((s) => s.sharedWithUserId === null)).toBe(true);
      // The invitation's mail is the surgeon's notice; no share notice is written for no one.
      expect(await ctx.db.select().from(shareNotices).where(eq(shareNotices.shareId, first.id))).toEqual([]);

      const { mail, token } = await linkMailedTo(email);
      expect(mail.subject).toMatch(/shared a patient with you on Torquetrail$/);
      expect(mail.text).toContain("your practice's name");
      expect(mail.text).not.toContain('Invitewell');
      // The People screen lists the practice's own invitations only.
      const people = await ctx.http.get('/api/people').set('Cookie', cookies.practice_admin);
      expect(JSON.stringify(people.body.invitations)).not.toContain(email);

      const seen = await preview(token);
      expect(seen.status).toBe(200);
      expect(seen.body).toMatchObject({ email, role: 'surgeon', ownPractice: true });
      const nameless = await accept(token);
      expect(nameless.status).toBe(400);
      expect(nameless.body.fields.practiceName).toMatch(/name of your practice/);
      expect((await accept(token, 'Harbourline Implant Surgery')).status).toBe(204);
      expect((await mailsTo(email)).length).toBe(1);

      const [account] = await ctx.db.select().from(users).where(eq(users.email, email));
      const [own] = await ctx.db.select().from(practices).where(eq(practices.id, account.practiceId));
      expect(account.role).toBe('surgeon');
      expect(own.name).toBe('Harbourline Implant Surgery');
      expect(account.practiceId).not.toBe(row.practiceId);

      const surgeon = await signInAs(ctx, email, PASSWORD);
      const patients = await ctx.http.get('/api/patients').set('Cookie', surgeon);
      expect(patients.status).toBe(200);
      expect(JSON.stringify(patients.body)).toContain('Invitewell');
      expect(JSON.stringify(patients.body)).toContain('Secondshare');
      expect((await ctx.http.get(`/api/sites/${p.s36}`).set('Cookie', surgeon)).status).toBe(200);
      expect((await ctx.http.get(`/api/sites/${p.s46}`).set('Cookie', surgeon)).status).toBe(404);
      expect((await sharesOf(p.id))[0]).toMatchObject({
        status: 'active',
        invitationExpiresAt: null,
        surgeon: { id: account.id, displayName: 'Dr Maren Holloway', practiceName: 'Harbourline Implant Surgery' },
      });

      const trail = await ctx.db.execute<{ action: string; user_id: string; practice_id: string; patient_id: string }>(
        sql`select action, user_id, practice_id, patient_id from audit_events
            where record_type = 'Share' and record_id in (${sql.join(
              both.map((s) => sql`${s.id}::uuid`),
              sql`, `,
            )}) order by at`,
      );
      const opened = trail.rows.filter((r) => r.user_id === account.id);
      expect(opened).toHaveLength(2);
      expect(opened.every((r) => r.action === 'share-change' && r.practice_id === row.practiceId)).toBe(true);
      expect(trail.rows.filter((r) => r.user_id !== account.id)).toHaveLength(2);
    },
  );

  it('revoked while invited: the share is revoked and the link stops working', { timeout: 60_000 }, async () => {
    const email = freshEmail('odile.fenwick', 'harbourline.example');
    const p = await patientWithTwoSites('Revokewell');
    const created = (await share(p.id, email)).body as Share;
    const { token } = await linkMailedTo(email);
    const revoked = await ctx.http
      .post(`/api/shares/${created.id}/revoke`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'Referred elsewhere' });
    expect(revoked.status).toBe(200);
    expect(revoked.body.status).toBe('revoked');
    const refused = await accept(token, 'Fenwick Surgery');
    expect(refused.status).toBe(410);
    expect(await ctx.db.select().from(users).where(eq(users.email, email))).toEqual([]);
  });

  it(
    'ends with its invitation; sharing again invites anew and the old share stays ended',
    { timeout: 60_000 },
    async () => {
      const email = freshEmail('tobias.quell', 'harbourline.example');
      const p = await patientWithTwoSites('Expirewell');
      const created = (await share(p.id, email)).body as Share;
      const { token } = await linkMailedTo(email);
      expect((await sharesOf(p.id))[0].invitationExpiresAt).not.toBeNull();
      const [row] = await ctx.db.select().from(patientShares).where(eq(patientShares.id, created.id));
      await ctx.db
        .update(invitations)
        .set({ expiresAt: new Date(Date.now() - 1000) })
        .where(eq(invitations.id, row.invitationId!));
      expect((await sharesOf(p.id))[0]).toMatchObject({ id: created.id, status: 'ended' });
      const late = await accept(token, 'Quell Surgery');
      expect(late.status).toBe(410);
      expect(late.body.message).toMatch(/share it again/);

      const again = (await share(p.id, email)).body as Share;
      expect(again.status).toBe('invited');
      const listed = await sharesOf(p.id);
      expect(listed.find((s) => s.id === created.id)?.status).toBe('ended');
      const second = await linkMailedTo(email, 2);
      expect((await accept(second.token, 'Quell Surgery')).status).toBe(204);
      const after = await sharesOf(p.id);
      expect(after.find((s) => s.id === again.id)?.status).toBe('active');
      expect(after.find((s) => s.id === created.id)?.status).toBe('ended');
    },
  );

  it('an address invited to join the practice itself is a 400 (a colleague), and writes nothing', async () => {
    const email = freshEmail('colleague.invited');
    expect(
      (
        await ctx.http
          .post('/api/people/invitations')
          .set('Cookie', cookies.practice_admin)
          .send({ email, role: 'hygienist' })
      ).status,
    ).toBe(201);
    const p = await patientWithTwoSites('Colleaguewell');
    const res = await share(p.id, email);
    expect(res.status).toBe(400);
    expect(res.body.fields.surgeonEmail).toMatch(/invited to join your practice/);
    expect(await sharesOf(p.id)).toEqual([]);
  });
});
