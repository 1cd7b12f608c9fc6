// Patients' records: create with a generated chart number, edit with a version per change,
// archive and bring back (never delete), the duplicate check, and what each role may change.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patients, patientVersions } from '../src/db/schema/index.js';
import { type AccountKey, patientId, signInAll, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookie: Record<AccountKey, string>;
let seq = 0;

beforeAll(async () => {
  ctx = await startTestApp();
  cookie = await signInAll(ctx);
});
afterAll(() => ctx.close());

/** A new patient of Larkspur Lane with a family name of its own (tests run in any order). */
async function newPatient(over: Record<string, unknown> = {}, who: AccountKey = 'dentist') {
  seq += 1;
  const res = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookie[who])
    .send({ givenName: 'Ottoline', familyName: `Quennell${seq}`, birthDate: '1968-02-29', ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; chartNumber: string; familyName: string };
}
const patch = (id: string, body: object, who: AccountKey = 'dentist') =>
  ctx.http.patch(`/api/patients/${id}`).set('Cookie', cookie[who]).send(body);
const versions = (id: string, who: AccountKey = 'dentist') =>
  ctx.http.get(`/api/patients/${id}/versions`).set('Cookie', cookie[who]);

describe('creating a patient', () => {
  it('gives the next chart number of the practice (its prefix, after the seeded ones) and a first version', async () => {
    const created = await newPatient({
      sex: 'female',
      phone: '+44 20 7946 0011',
      email: 'ottoline@mail.example',
      preferredLanguage: 'fr',
      emailReminderConsent: true,
      emailReminderConsentOn: '2026-01-05',
      smoker: true,
      riskFactorsRecordedOn: '2026-01-05',
    });
    expect(created.chartNumber).toMatch(/^LL-1\d{3}$/);
    expect(Number(created.chartNumber.slice(3))).toBeGreaterThan(1005);
    const detail = await ctx.http.get(`/api/patients/${created.id}`).set('Cookie', cookie.dentist);
    expect(detail.body).toMatchObject({
      sex: 'female',
      contact: { phone: '+44 20 7946 0011', preferredLanguage: 'fr', emailReminderConsent: true },
      riskFactors: { smoker: true, diabetesPoorlyControlled: false },
      chartNumberChangeable: true,
      archive: null,
    });
    const history = await versions(created.id);
    expect(history.status).toBe(200);
    expect(history.body.items).toHaveLength(1);
    expect(history.body.items[0]).toMatchObject({ version: 1, kind: 'created', changedByName: 'Dr Ines Calloway' });
    expect(history.body.items[0].changes).toContainEqual({ field: 'smoker', before: null, after: true });
  });

  it('refuses a body the contract refuses, naming the field in plain words, and saves nothing', async () => {
    const before = await ctx.db.select({ id: patients.id }).from(patients);
    const res = await ctx.http.post('/api/patients').set('Cookie', cookie.dentist).send({
      givenName: '',
      familyName: 'Pemberton',
      birthDate: '1980-13-40',
      emailReminderConsent: true,
    });
    expect(res.status).toBe(400);
    expect(res.body.fields).toMatchObject({
      givenName: 'Enter the given name',
      birthDate: 'Enter a date as YYYY-MM-DD',
      emailReminderConsentOn: 'Enter the date the patient gave consent',
    });
    expect(res.body.fields.email).toMatch(/e-mail address/);
    const future = await ctx.http
      .post('/api/patients')
      .set('Cookie', cookie.dentist)
      .send({ givenName: 'Ada', familyName: 'Pemberton', birthDate: '2099-01-01' });
    expect(future.status).toBe(400);
    expect(future.body.fields).toEqual({ birthDate: 'The date of birth cannot be in the future' });
    expect(await ctx.db.select({ id: patients.id }).from(patients)).toHaveLength(before.length);
  });

  it('gives parallel creates different chart numbers (the sequence row serialises them)', async () => {
    const made = await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        ctx.http
          .post('/api/patients')
          .set('Cookie', cookie[i % 2 === 0 ? 'dentist' : 'practice_admin'])
          .send({ givenName: 'Parallel', familyName: `Runciman${i}`, birthDate: '1990-06-01' }),
      ),
    );
    expect(made.map((r) => r.status)).toEqual(made.map(() => 201));
    const numbers = made.map((r) => (r.body as { chartNumber: string }).chartNumber);
    expect(new Set(numbers).size).toBe(12);
    console.log(`[figures] 12 parallel creates: 12 distinct chart numbers (${numbers.sort().join(', ')})`);
  });

  it('uses the prefix the practice admin sets; other roles may read it but not set it', async () => {
    const refused = await ctx.http
      .put('/api/practice/patient-settings')
      .set('Cookie', cookie.dentist)
      .send({ chartPrefix: 'X-' });
    expect(refused.status).toBe(403);
    const bad = await ctx.http
      .put('/api/practice/patient-settings')
      .set('Cookie', cookie.practice_admin)
      .send({ chartPrefix: 'L L' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.chartPrefix).toMatch(/no spaces/);
    // Quarry Hill's own prefix: this test leaves Larkspur's numbering alone for the others.
    const quarryAdmin = await ctx.http.get('/api/practice/patient-settings').set('Cookie', cookie.otherPracticeDentist);
    expect(quarryAdmin.body.chartPrefix).toBe('QH-');
    const settings = await ctx.http.get('/api/practice/patient-settings').set('Cookie', cookie.hygienist);
    expect(settings.status).toBe(200);
    expect(settings.body.chartPrefix).toBe('LL-');
  });

  it('the surgeon and the hygienist cannot create a patient', async () => {
    for (const who of ['surgeon', 'hygienist'] as const) {
      const res = await ctx.http
        .post('/api/patients')
        .set('Cookie', cookie[who])
        .send({ givenName: 'No', familyName: 'Body', birthDate: '1970-01-01' });
      expect(res.status, who).toBe(403);
    }
  });
});

describe('editing a patient keeps every version', () => {
  it('writes one version per change with each field before and after; an unchanged save writes none', async () => {
    const p = await newPatient();
    const res = await patch(p.id, { givenName: 'Ottilie', phone: '+44 161 496 0000', diabetesPoorlyControlled: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.givenName).toBe('Ottilie');
    // A risk factor changed without a date: it was recorded today.
    expect(res.body.riskFactorsRecordedOn).toBe(new Date().toISOString().slice(0, 10));
    const same = await patch(p.id, { givenName: 'Ottilie' });
    expect(same.status).toBe(200);
    const history = (await versions(p.id)).body.items as { version: number; kind: string; changes: unknown[] }[];
    expect(history.map((v) => [v.version, v.kind])).toEqual([
      [1, 'created'],
      [2, 'edited'],
    ]);
    expect(history[1].changes).toEqual([
      { field: 'givenName', before: 'Ottoline', after: 'Ottilie' },
      { field: 'phone', before: null, after: '+44 161 496 0000' },
      { field: 'diabetesPoorlyControlled', before: false, after: true },
      { field: 'riskFactorsRecordedOn', before: null, after: res.body.riskFactorsRecordedOn },
    ]);
  });

  it('lets the chart number change once, unique in the practice', async () => {
    const p = await newPatient();
    const taken = await patch(p.id, { chartNumber: 'LL-1001' });
    expect(taken.status).toBe(409);
    expect(taken.body.fields.chartNumber).toMatch(/already another patient's/);
    const first = await patch(p.id, { chartNumber: `PAPER-${p.chartNumber}` });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ chartNumber: `PAPER-${p.chartNumber}`, chartNumberChangeable: false });
    const second = await patch(p.id, { chartNumber: `AGAIN-${p.chartNumber}` });
    expect(second.status).toBe(409);
    expect(second.body.fields.chartNumber).toMatch(/changed once already/);
    // Quarry Hill may use the same number: unique per practice.
    const [qh] = await ctx.db.select().from(patients).where(eq(patients.chartNumber, 'QH-2001'));
    const other = await ctx.http
      .patch(`/api/patients/${qh.id}`)
      .set('Cookie', cookie.otherPracticeDentist)
      .send({ chartNumber: 'LL-1001' });
    expect(other.status).toBe(200);
  });

  it('lets the hygienist change contact details only; any other field is 403 naming it', async () => {
    const p = await newPatient();
    const contact = await patch(
      p.id,
      {
        phone: '+44 29 2018 0000',
        email: 'q@mail.example',
        preferredLanguage: 'de',
        emailReminderConsent: true,
        emailReminderConsentOn: '2026-02-01',
      },
      'hygienist',
    );
    expect(contact.status, JSON.stringify(contact.body)).toBe(200);
    expect(contact.body.contact).toMatchObject({ preferredLanguage: 'de', emailReminderConsent: true });
    const refused = await patch(p.id, { phone: '+44 29 2018 0001', familyName: 'Other', smoker: true }, 'hygienist');
    expect(refused.status).toBe(403);
    expect(refused.body.message).toBe('Your role may change only the contact details: 2 fields were not changed');
    expect(refused.body.fields).toEqual({
      familyName: 'Your role may not change this field',
      smoker: 'Your role may not change this field',
    });
    const history = (await versions(p.id)).body.items as { changedByName: string }[];
    expect(history.map((v) => v.changedByName)).toEqual(['Dr Ines Calloway', 'Maren Holt']);
    // Nothing of the refused request was written.
    const [row] = await ctx.db.select().from(patients).where(eq(patients.id, p.id));
    expect(row.phone).toBe('+44 29 2018 0000');
  });

  it('refuses the surgeon (the role may not edit: 403) and another practice (404)', async () => {
    const harold = await patientId(ctx.db, 'LL-1001');
    expect((await patch(harold, { phone: '+44 1 2345' }, 'surgeon')).status).toBe(403);
    expect((await patch(harold, { phone: '+44 1 2345' }, 'otherPracticeDentist')).status).toBe(404);
    const p = await newPatient();
    expect((await patch(p.id, { phone: '+44 1 2345' }, 'surgeon')).status).toBe(403);
    expect((await versions(p.id, 'hygienist')).status).toBe(403);
    expect((await versions(p.id, 'otherPracticeDentist')).status).toBe(404);
    expect((await versions(p.id, 'practice_admin')).status).toBe(200);
  });

  it('keeps a shared surgeon from the contact details', async () => {
    const harold = await patientId(ctx.db, 'LL-1001');
    const res = await ctx.http.get(`/api/patients/${harold}`).set('Cookie', cookie.surgeon);
    expect(res.status).toBe(200);
    // Left out of the reply by the share's field rules (issue 12), not merely emptied.
    expect(res.body).not.toHaveProperty('contact');
  });
});

describe('archiving', () => {
  it('archives with a reason as a version, hides the patient from the list unless asked, and brings them back', async () => {
    const p = await newPatient();
    const noReason = await ctx.http.post(`/api/patients/${p.id}/archive`).set('Cookie', cookie.dentist).send({});
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields.reason).toBeDefined();
    expect(
      (await ctx.http.post(`/api/patients/${p.id}/archive`).set('Cookie', cookie.hygienist).send({ reason: 'Moved' }))
        .status,
    ).toBe(403);
    const archived = await ctx.http
      .post(`/api/patients/${p.id}/archive`)
      .set('Cookie', cookie.practice_admin)
      .send({ reason: 'Moved abroad' });
    expect(archived.status).toBe(200);
    expect(archived.body.archive).toMatchObject({ byName: 'Odile Park', reason: 'Moved abroad' });

    const list = (filter: string) =>
      ctx.http
        .get(`/api/patients?search=${p.familyName}&archived=${filter}`)
        .set('Cookie', cookie.dentist)
        .then((r) => (r.body.items as { id: string }[]).map((i) => i.id));
    expect(await list('active')).toEqual([]);
    expect(await list('archived')).toEqual([p.id]);
    expect(await list('all')).toEqual([p.id]);
    expect((await patch(p.id, { phone: '+44 1 2345' })).status).toBe(409);

    const back = await ctx.http
      .post(`/api/patients/${p.id}/unarchive`)
      .set('Cookie', cookie.dentist)
      .send({ reason: 'Returned to the area' });
    expect(back.status).toBe(200);
    expect(back.body.archive).toBeNull();
    expect(await list('active')).toEqual([p.id]);
    const history = (await versions(p.id)).body.items as { kind: string; reason: string | null }[];
    expect(history.map((v) => [v.kind, v.reason])).toEqual([
      ['created', null],
      ['archived', 'Moved abroad'],
      ['unarchived', 'Returned to the area'],
    ]);
    // Never deleted: the row and every version are there.
    expect(await ctx.db.select().from(patientVersions).where(eq(patientVersions.patientId, p.id))).toHaveLength(3);
  });

  it('leaves archived patients off the Recall desk unless the filter asks for them', async () => {
    const desmond = await patientId(ctx.db, 'LL-1003');
    const desk = (archived: string) =>
      ctx.http
        .get(`/api/recalls/desk?search=Okafor&archived=${archived}`)
        .set('Cookie', cookie.hygienist)
        .then((r) => (r.body.items as { patientId: string }[]).map((i) => i.patientId));
    expect(await desk('active')).toEqual([desmond]);
    await ctx.http.post(`/api/patients/${desmond}/archive`).set('Cookie', cookie.dentist).send({ reason: 'Test' });
    expect(await desk('active')).toEqual([]);
    expect(await desk('archived')).toEqual([desmond]);
    await ctx.http.post(`/api/patients/${desmond}/unarchive`).set('Cookie', cookie.dentist).send({ reason: 'Test' });
  });
});

describe('the duplicate check', () => {
  it('finds the same family name (case and accents aside) and birth date in the practice only', async () => {
    const p = await newPatient({ familyName: 'Ødegård-Élan', birthDate: '1977-07-07' });
    const check = (familyName: string, birthDate: string, who: AccountKey = 'dentist') =>
      ctx.http
        .get(`/api/patients/duplicates?${new URLSearchParams({ familyName, birthDate })}`)
        .set('Cookie', cookie[who]);
    const found = await check('ødegard-elan', '1977-07-07');
    expect(found.status).toBe(200);
    expect(found.body.matches.map((m: { id: string }) => m.id)).toEqual([p.id]);
    expect((await check('ØDEGÅRD-ÉLAN', '1977-07-07')).body.matches).toHaveLength(1);
    expect((await check('Odegard-Elan', '1977-07-08')).body.matches).toEqual([]);
    expect((await check('ødegård-élan', '1977-07-07', 'otherPracticeDentist')).body.matches).toEqual([]);
    // The user can still save: the check warns, it does not refuse.
    await newPatient({ familyName: 'ødegård-élan', birthDate: '1977-07-07' });
    expect((await check('Ødegård-Élan', '1977-07-07')).body.matches).toHaveLength(2);
    const excluded = await ctx.http
      .get(`/api/patients/duplicates?${new URLSearchParams({ familyName: 'x', birthDate: 'nope' })}`)
      .set('Cookie', cookie.dentist);
    expect(excluded.status).toBe(400);
    expect(excluded.body.fields.birthDate).toBeDefined();
  });
});
