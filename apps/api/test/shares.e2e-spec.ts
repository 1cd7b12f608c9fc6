// Shares (issue 12): a dentist shares a patient with a surgeon of another practice, found by the
// exact e-mail, with a scope and chosen sites; the ability follows the share on the surgeon's next
// request (revoked or ended: 404 everywhere at once), every change is audited and e-mailed.
import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { SHARED_PATIENT_FIELDS } from '@torquetrail/authz';
import { patientShares } from '../src/db/schema/index.js';
import { mailsTo, signInAs, throwawayAccount } from './support/people.js';
import { until } from './support/recalls.js';
import { ACCOUNTS, signInAll, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);

/** A new Larkspur patient with planned sites at 36 and 46, made through the API as the dentist. */
async function patientWithTwoSites() {
  const patient = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookies.dentist)
    .send({ givenName: 'Sharon', familyName: 'Testwood', birthDate: '1966-04-12' });
  expect(patient.status).toBe(201);
  const site = async (fdi: number) => {
    const res = await ctx.http
      .post(`/api/patients/${patient.body.id}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi });
    expect(res.status).toBe(201);
    return res.body.id as string;
  };
  return { id: patient.body.id as string, s36: await site(36), s46: await site(46) };
}

/** A surgeon of Northgate of their own, signed in. */
async function freshSurgeon() {
  const account = await throwawayAccount(ctx, 'surgeon');
  return { ...account, cookie: await signInAs(ctx, account.email) };
}

type ShareBody = {
  surgeonEmail: string;
  scopes: string[];
  siteIds: string[] | null;
  endsOn: string | null;
  reason: string;
};
const share = (patientId: string, body: ShareBody, as = cookies.dentist) =>
  ctx.http.post(`/api/patients/${patientId}/shares`).set('Cookie', as).send(body);

const get = (path: string, cookie: string) => ctx.http.get(path).set('Cookie', cookie);

/** Every read route of one patient and its sites the surgeon could call. */
const patientRoutes = (p: { id: string; s36: string; s46: string }) => [
  `/api/patients/${p.id}`,
  `/api/patients/${p.id}/restorations`,
  `/api/patients/${p.id}/radiographs`,
  `/api/recalls/patients/${p.id}/exam-context`,
  ...[p.s36, p.s46].flatMap((s) => [
    `/api/sites/${s}`,
    `/api/sites/${s}/timeline`,
    `/api/sites/${s}/bone-levels`,
    `/api/recalls/sites/${s}/exams`,
  ]),
];

async function platformOf(siteId: string) {
  const res = await get(`/api/sites/${siteId}/placement-options`, cookies.dentist);
  return res.body.systems[0].platforms[0].id as string;
}

describe('sharing a patient', () => {
  it('opens only the chosen sites, reads but places nothing without the placement scope, and says so in the list', async () => {
    const p = await patientWithTwoSites();
    const surgeon = await freshSurgeon();
    const created = await share(p.id, {
      surgeonEmail: surgeon.email.toUpperCase(),
      scopes: ['outcomes'],
      siteIds: [p.s36],
      endsOn: null,
      reason: 'Follows the implant at 36',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body).toMatchObject({
      status: 'active',
      scopes: ['outcomes'],
      sites: [{ id: p.s36, fdi: 36 }],
      surgeon: { email: surgeon.email, practiceName: 'Northgate Oral Surgery' },
      sharedByName: expect.any(String),
    });

    const detail = await get(`/api/patients/${p.id}`, surgeon.cookie);
    expect(detail.status).toBe(200);
    expect(detail.body.sites.map((s: { fdi: number }) => s.fdi)).toEqual([36]);
    expect((await get(`/api/sites/${p.s36}`, surgeon.cookie)).status).toBe(200);
    // A site outside the share reads like a missing one; placement without its scope is refused.
    expect((await get(`/api/sites/${p.s46}`, surgeon.cookie)).status).toBe(404);
    const platformId = await platformOf(p.s36);
    const placement = { platformId, placedOn: '2026-01-05', lengthMm: 10 };
    const refused = await ctx.http.post(`/api/sites/${p.s36}/placements`).set('Cookie', surgeon.cookie).send(placement);
    expect(refused.status).toBe(403);
    const outside = await ctx.http.post(`/api/sites/${p.s46}/placements`).set('Cookie', surgeon.cookie).send(placement);
    expect(outside.status).toBe(404);

    const list = await get('/api/patients', surgeon.cookie);
    expect(list.body.items).toEqual([
      expect.objectContaining({ id: p.id, practiceName: 'Larkspur Lane Dental', shareScopes: ['outcomes'] }),
    ]);
  });

  it('with the placement scope records the placement of a shared site only', async () => {
    const p = await patientWithTwoSites();
    const surgeon = await freshSurgeon();
    const created = await share(p.id, {
      surgeonEmail: surgeon.email,
      scopes: ['placement'],
      siteIds: [p.s46],
      endsOn: '2100-12-31',
      reason: 'Referred for the implant at 46',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const placement = { platformId: await platformOf(p.s46), placedOn: '2026-01-05', lengthMm: 10 };
    const placed = await ctx.http.post(`/api/sites/${p.s46}/placements`).set('Cookie', surgeon.cookie).send(placement);
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const other = await ctx.http.post(`/api/sites/${p.s36}/placements`).set('Cookie', surgeon.cookie).send(placement);
    expect(other.status).toBe(404);
    // Placement alone reads no recall findings of the site.
    expect((await get(`/api/recalls/sites/${p.s46}/exams`, surgeon.cookie)).status).toBe(404);
  });

  it('revoked: every route of the patient answers 404 on the next request, and the surgeon is told', async () => {
    const p = await patientWithTwoSites();
    const surgeon = await freshSurgeon();
    const created = await share(p.id, {
      surgeonEmail: surgeon.email,
      scopes: ['placement', 'outcomes'],
      siteIds: null,
      endsOn: null,
      reason: 'Placed both implants',
    });
    expect(created.status).toBe(201);
    const before = await Promise.all(
      patientRoutes(p).map(async (path) => [path, (await get(path, surgeon.cookie)).status]),
    );
    expect(before.filter(([, status]) => status !== 200)).toEqual([]);

    const revoked = await ctx.http
      .post(`/api/shares/${created.body.id}/revoke`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'Treatment finished' });
    expect(revoked.status).toBe(200);
    expect(revoked.body).toMatchObject({ status: 'revoked', revokeReason: 'Treatment finished' });
    // The same session, no sign-in again: the ability is built from the shares on every request.
    const after = await Promise.all(
      patientRoutes(p).map(async (path) => [path, (await get(path, surgeon.cookie)).status]),
    );
    expect(after.filter(([, status]) => status !== 404)).toEqual([]);
    expect((await get('/api/patients', surgeon.cookie)).body.items).toEqual([]);
    const again = await ctx.http
      .post(`/api/shares/${created.body.id}/revoke`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'Twice' });
    expect(again.status).toBe(409);

    const mails = await until(async () => {
      const caught = await mailsTo(surgeon.email);
      return caught.length >= 2 && caught;
    }, 30_000);
    expect(mails.map((m) => m.subject).sort()).toEqual([
      'Larkspur Lane Dental ended a share on Torquetrail',
      'Larkspur Lane Dental shared a patient with you on Torquetrail',
    ]);
    // The e-mail names the practice and the scope, never the patient.
    for (const mail of mails) expect(mail.text).not.toMatch(/Sharon|Testwood/);

    const { rows } = await ctx.db.execute<{ action: string; patient_id: string; record_type: string }>(sql`
      select action, patient_id, record_type from audit_events
      where record_id = ${created.body.id} and outcome = 'allowed' order by at`);
    expect(rows).toEqual([
      { action: 'share-change', patient_id: p.id, record_type: 'Share' },
      { action: 'share-change', patient_id: p.id, record_type: 'Share' },
    ]);
  });

  it('past its end date: closed at once, without anyone revoking it', async () => {
    const p = await patientWithTwoSites();
    const surgeon = await freshSurgeon();
    const created = await share(p.id, {
      surgeonEmail: surgeon.email,
      scopes: ['outcomes'],
      siteIds: null,
      endsOn: new Date().toISOString().slice(0, 10),
      reason: 'One day only',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect((await get(`/api/patients/${p.id}`, surgeon.cookie)).status).toBe(200);
    // The day passes (moved back in the database: the API has no clock to pin for shares).
    await ctx.db.update(patientShares).set({ endsOn: '2020-01-01' }).where(eq(patientShares.id, created.body.id));
    const after = await Promise.all(
      patientRoutes(p).map(async (path) => [path, (await get(path, surgeon.cookie)).status]),
    );
    expect(after.filter(([, status]) => status !== 404)).toEqual([]);
    const listed = await get(`/api/patients/${p.id}/shares`, cookies.dentist);
    expect(listed.body.items).toEqual([expect.objectContaining({ id: created.body.id, status: 'ended' })]);
  });
});

describe('bad input', () => {
  const body = (surgeonEmail: string, over: Partial<ShareBody> = {}): ShareBody => ({
    surgeonEmail,
    scopes: ['outcomes'],
    siteIds: null,
    endsOn: null,
    reason: 'Referral',
    ...over,
  });

  it.each([
    ['a user who is not a surgeon', ACCOUNTS.otherPracticeDentist, 'not a referring surgeon'],
    ['oneself', ACCOUNTS.dentist, 'your own address'],
    ['a colleague of the same practice', ACCOUNTS.hygienist, 'works in your practice'],
  ])('sharing with %s is a 400 on the e-mail field, and writes nothing', async (_what, email, words) => {
    const p = await patientWithTwoSites();
    const res = await share(p.id, body(email));
    expect(res.status).toBe(400);
    expect(res.body.fields.surgeonEmail).toContain(words);
    const rows = await ctx.db.select().from(patientShares).where(eq(patientShares.patientId, p.id));
    expect(rows).toEqual([]);
  });

  it('an end date in the past, a site of another patient or no scope is a 400 on that field', async () => {
    const p = await patientWithTwoSites();
    const q = await patientWithTwoSites();
    const surgeon = await throwawayAccount(ctx, 'surgeon');
    const past = await share(p.id, body(surgeon.email, { endsOn: '2024-01-01' }));
    expect(past.status).toBe(400);
    expect(past.body.fields.endsOn).toMatch(/passed/);
    const foreign = await share(p.id, body(surgeon.email, { siteIds: [p.s36, q.s46] }));
    expect(foreign.status).toBe(400);
    expect(foreign.body.fields.siteIds).toBeTruthy();
    const none = await share(p.id, body(surgeon.email, { scopes: [] }));
    expect(none.status).toBe(400);
    expect(none.body.fields.scopes).toBeTruthy();
  });

  it("another practice's patient or share reads like a missing one", async () => {
    const p = await patientWithTwoSites();
    const surgeon = await throwawayAccount(ctx, 'surgeon');
    const created = await share(p.id, body(surgeon.email));
    expect(created.status).toBe(201);
    expect((await share(p.id, body(surgeon.email), cookies.otherPracticeDentist)).status).toBe(404);
    const revoke = await ctx.http
      .post(`/api/shares/${created.body.id}/revoke`)
      .set('Cookie', cookies.otherPracticeDentist)
      .send({ reason: 'Not mine' });
    expect(revoke.status).toBe(404);
    const theirs = await get('/api/shares', cookies.otherPracticeDentist);
    expect(theirs.body.items.map((s: { id: string }) => s.id)).not.toContain(created.body.id);
  });
});

describe('the seeded shares', () => {
  it('show an active, an ended and a revoked share to the practice', async () => {
    const res = await get('/api/shares', cookies.practice_admin);
    expect(res.status).toBe(200);
    const statuses = res.body.items
      .filter((s: { surgeon: { email: string } }) => s.surgeon.email === ACCOUNTS.surgeon)
      .map((s: { status: string }) => s.status);
    expect(statuses.filter((s: string) => s === 'active')).toHaveLength(4);
    expect(statuses).toContain('ended');
    expect(statuses).toContain('revoked');
  });
});

describe('least privilege in the replies', () => {
  it("a shared surgeon's patient reply holds who the patient is and the shared sites, nothing more", async () => {
    const p = await patientWithTwoSites();
    const surgeon = await freshSurgeon();
    const created = await share(p.id, {
      surgeonEmail: surgeon.email,
      scopes: ['outcomes'],
      siteIds: [p.s46],
      endsOn: null,
      reason: 'Follows the implant at 46',
    });
    expect(created.status).toBe(201);
    const mine = await get(`/api/patients/${p.id}`, cookies.dentist);
    expect(mine.body).toHaveProperty('riskFactors');
    expect(mine.body).toHaveProperty('contact');
    const theirs = await get(`/api/patients/${p.id}`, surgeon.cookie);
    expect(Object.keys(theirs.body).sort()).toEqual([...SHARED_PATIENT_FIELDS].filter((f) => f in mine.body).sort());
    for (const field of ['riskFactors', 'contact', 'sex', 'missingTeeth', 'archive', 'riskFactorsRecordedOn'])
      expect(theirs.body).not.toHaveProperty(field);
    expect(theirs.body.sites.map((s: { id: string }) => s.id)).toEqual([p.s46]);
  });
});
