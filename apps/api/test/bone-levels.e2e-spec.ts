// Measured bone levels feed the record: GET /sites/:id/bone-levels (latest first, amendments
// resolved, entered-in-error radiographs left out, the Albrektsson and ICOI views), the viewer's
// implant length when the placement has none, and the exam form's offer with its source.
// Each test makes its own implant site of Lucía Ferraz (shared with the surgeon), so the seeded
// history cannot change the expected values.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { implantSites, placements } from '../src/db/schema/index.js';
import { larkspurId, platformId } from './support/ledger-fixtures.js';
import { jpeg } from './support/radiograph-fixtures.js';
import { patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let hygienist: string;
let surgeon: string;
let other: string;
let lucia: string;
let okafor: string;
let platform: string;
let grey = 0;

beforeAll(async () => {
  ctx = await startTestApp();
  [dentist, hygienist, surgeon, other] = await Promise.all([
    signIn(ctx, 'dentist'),
    signIn(ctx, 'hygienist'),
    signIn(ctx, 'surgeon'),
    signIn(ctx, 'otherPracticeDentist'),
  ]);
  lucia = await patientId(ctx.db, 'LL-1004');
  okafor = await patientId(ctx.db, 'LL-1003');
  platform = await platformId(ctx.db, await larkspurId(ctx.db), 'Solvra CN 3.5');
});
afterAll(() => ctx.close());

/** A new implant site of the patient at a position it does not use, placed (11.5 mm) unless `placed` is false. */
async function newSite(patient = lucia, placed = true): Promise<string> {
  const taken = new Set(
    (await ctx.db.select({ fdi: implantSites.fdi }).from(implantSites).where(eq(implantSites.patientId, patient))).map(
      (s) => s.fdi,
    ),
  );
  const fdi = [17, 16, 15, 13, 12, 22, 23, 25, 26, 27, 37, 36, 34, 33, 43, 44, 45, 47, 18, 28, 38, 48].find(
    (f) => !taken.has(f),
  );
  if (fdi === undefined) throw new Error('no free position');
  const res = await ctx.http.post(`/api/patients/${patient}/sites`).set('Cookie', dentist).send({ fdi });
  if (res.status !== 201) throw new Error(`site: ${res.status} ${JSON.stringify(res.body)}`);
  if (placed) {
    const p = await ctx.http
      .post(`/api/sites/${res.body.id}/placements`)
      .set('Cookie', dentist)
      .send({ platformId: platform, placedOn: '2020-01-10', lengthMm: 11.5 });
    if (p.status !== 201) throw new Error(`placement: ${p.status} ${JSON.stringify(p.body)}`);
  }
  return res.body.id as string;
}

async function upload(site: string, takenOn: string, patient = lucia): Promise<string> {
  const res = await ctx.http
    .post(`/api/patients/${patient}/radiographs?siteIds=${site}&takenOn=${takenOn}&kind=periapical`)
    .set('Cookie', dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(await jpeg(8, 8, ++grey));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/**
 * Marks on a 200-pixel implant (platform centre row 10, apex row 210, column 30): with 11.5 mm
 * that is 0.0575 mm per pixel, so a contact `rows` pixels below the platform is rows × 0.0575 mm.
 */
const points = (mesialRows: number, distalRows: number) => ({
  platform: [
    { row: 10, col: 20 },
    { row: 10, col: 40 },
  ],
  apex: { row: 210, col: 30 },
  mesial: { row: 10 + mesialRows, col: 21 },
  distal: { row: 10 + distalRows, col: 39 },
});

async function measure(cookie: string, radiograph: string, site: string, body: object = {}) {
  return ctx.http
    .post(`/api/radiographs/${radiograph}/measurements`)
    .set('Cookie', cookie)
    .send({ siteId: site, points: points(20, 10), ...body });
}

const boneLevels = (cookie: string, site: string) =>
  ctx.http.get(`/api/sites/${site}/bone-levels`).set('Cookie', cookie);

describe('GET /api/sites/:id/bone-levels', () => {
  it('latest first, the amended version in place of the first, an entered-in-error radiograph left out', async () => {
    const site = await newSite();
    const [r2021, r2023, r2024, rWrong] = [
      await upload(site, '2021-02-01'),
      await upload(site, '2023-02-01'),
      await upload(site, '2024-02-01'),
      await upload(site, '2025-02-01'),
    ];
    // 2021: mesial 20 px = 1.15 mm, distal 10 px = 0.575 mm
    expect((await measure(hygienist, r2021, site)).status).toBe(201);
    // 2023: first measured, then amended to mesial 30 px = 1.725 mm, distal 40 px = 2.3 mm
    const first = await measure(dentist, r2023, site, { points: points(24, 24) });
    expect(first.status).toBe(201);
    const amended = await ctx.http
      .post(`/api/radiograph-measurements/${first.body.id}/amendments`)
      .set('Cookie', dentist)
      .send({ points: points(30, 40), reason: 'Distal contact marked one thread too high' });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    // 2024: mesial 36 px = 2.07 mm, distal 20 px = 1.15 mm
    expect((await measure(dentist, r2024, site, { points: points(36, 20) })).status).toBe(201);
    // 2025: measured, then the radiograph is marked entered in error
    expect((await measure(dentist, rWrong, site, { points: points(100, 100) })).status).toBe(201);
    const wrong = await ctx.http
      .post(`/api/radiographs/${rWrong}/entered-in-error`)
      .set('Cookie', dentist)
      .send({ reason: 'Another patient' });
    expect(wrong.status).toBe(200);

    const res = await boneLevels(dentist, site);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.implantLengthMm).toBe(11.5);
    expect(res.body.loadedOn).toBeNull();
    expect(
      res.body.items.map((i: { radiographId: string; amended: boolean; examBoneLevelMm: number }) => [
        i.radiographId,
        i.amended,
        i.examBoneLevelMm,
      ]),
    ).toEqual([
      [r2024, false, 2.1],
      [r2023, true, 2.3],
      [r2021, false, 1.2],
    ]);
    expect(res.body.items[1].mesialMm).toBeCloseTo(1.725, 6);
    expect(res.body.items[1].distalMm).toBeCloseTo(2.3, 6);
    expect(res.body.items[1].measurementId).toBe(amended.body.id);
    expect(res.body.items[2].measuredBy).toMatch(/\S/);
    // No delivery: no Albrektsson view; ICOI of the latest worse value 2.07 mm → II (2–4 mm)
    expect(res.body.albrektsson).toBeNull();
    expect(res.body.icoi.grade).toBe('II');
    expect(res.body.icoi.boneLossMm).toBeCloseTo(2.07, 6);
  });

  it('no measurement yet: an empty list and no criteria', async () => {
    const res = await boneLevels(dentist, await newSite());
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ items: [], albrektsson: null, icoi: null });
  });

  it('with a delivered restoration the Albrektsson view starts at loading', async () => {
    // Harold's 35 carries a delivered restoration in the seed: its loading date is the delivery's.
    const harold = await patientId(ctx.db, 'LL-1001');
    const seeded = (await ctx.http.get(`/api/patients/${harold}`).set('Cookie', dentist)).body.sites.find(
      (s: { fdi: number }) => s.fdi === 35,
    );
    const before = await boneLevels(dentist, seeded.id);
    const loadedOn = before.body.loadedOn as string;
    expect(loadedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const yearLater = `${Number(loadedOn.slice(0, 4)) + 1}${loadedOn.slice(4)}`;
    for (const [date, rows] of [
      [loadedOn, 10],
      [yearLater, 20],
    ] as const) {
      const r = await upload(seeded.id, date, harold);
      expect((await measure(dentist, r, seeded.id, { points: points(rows, rows) })).status).toBe(201);
    }
    const res = await boneLevels(dentist, seeded.id);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.albrektsson).not.toBeNull();
    expect(res.body.albrektsson.firstYearLossMm).not.toBeNull();
    expect(res.body.albrektsson.allowance[0].date).toBe(loadedOn);
    expect(res.body.albrektsson.allowance[1].maxBoneLevelMm).toBe(res.body.albrektsson.allowance[0].maxBoneLevelMm);
  });

  it('who may read: the sharing surgeon yes; the surgeon without a share and another practice 404', async () => {
    const shared = await newSite();
    const unshared = await newSite(okafor);
    expect((await boneLevels(hygienist, shared)).status).toBe(200);
    expect((await boneLevels(surgeon, shared)).status).toBe(200);
    expect((await boneLevels(surgeon, unshared)).status).toBe(404);
    expect((await boneLevels(other, shared)).status).toBe(404);
    expect((await ctx.http.get(`/api/sites/${shared}/bone-levels`)).status).toBe(401);
    expect((await boneLevels(dentist, '00000000-0000-4000-8000-000000000000')).status).toBe(404);
  });
});

describe('measuring when the placement record has no implant length', () => {
  it('asks for the length, uses it for that measurement and leaves the placement record alone', async () => {
    const site = await newSite(lucia, false);
    const radiograph = await upload(site, '2024-06-01');
    const detail = await ctx.http.get(`/api/radiographs/${radiograph}`).set('Cookie', dentist);
    expect(detail.body.siteImplants).toEqual([{ siteId: site, implantLengthMm: null }]);

    const missing = await measure(dentist, radiograph, site);
    expect(missing.status).toBe(400);
    expect(missing.body.fields.implantTrueMm).toMatch(/implant length/);
    const tooShort = await measure(dentist, radiograph, site, { implantTrueMm: 2 });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.fields.implantTrueMm).toMatch(/4–25 mm/);

    // 10 mm over 200 px: mesial 20 px = 1.0 mm, distal 10 px = 0.5 mm
    const ok = await measure(dentist, radiograph, site, { implantTrueMm: 10 });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body).toMatchObject({ implantTrueMm: 10, mmPerUnit: 0.05 });
    expect(ok.body.mesialMm).toBeCloseTo(1.0, 9);
    expect(await ctx.db.select().from(placements).where(eq(placements.siteId, site))).toEqual([]);
    // The chart takes the length the measurement used.
    const levels = await boneLevels(dentist, site);
    expect(levels.body.implantLengthMm).toBe(10);
    expect(levels.body.icoi.grade).toBe('I');
  });
});

describe('the exam form offers the latest measured bone level', () => {
  const exam = (site: string, extra: object) => ({
    siteId: site,
    sites: ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'].map((position) => ({
      position,
      probingDepthMm: 3,
      bleeding: false,
      suppuration: false,
    })),
    mobility: false,
    ...extra,
  });
  const visit = (examinedOn: string, exams: object[]) =>
    ctx.http.post('/api/recalls/visits').set('Cookie', hygienist).send({ patientId: lucia, examinedOn, exams });

  it('with its source; accepted with the source, typed over without it, refused when they disagree', async () => {
    const site = await newSite();
    const older = await upload(site, '2022-03-01');
    const newer = await upload(site, '2024-03-01');
    expect((await measure(dentist, older, site, { points: points(60, 60) })).status).toBe(201);
    const latest = await measure(hygienist, newer, site, { points: points(30, 50) });
    expect(latest.status).toBe(201);

    const context = await ctx.http.get(`/api/recalls/patients/${lucia}/exam-context`).set('Cookie', hygienist);
    expect(context.status).toBe(200);
    const offers = context.body.sites.find((s: { siteId: string }) => s.siteId === site).measuredBoneLevels;
    // Both, latest first; the form offers the latest of the exam's day or earlier (boneLevelOfferFor).
    expect(offers.map((o: { radiographId: string }) => o.radiographId)).toEqual([newer, older]);
    const offer = offers[0];
    // distal 50 px × 0.0575 = 2.875 mm → 2.9 mm
    expect(offer).toMatchObject({
      measurementId: latest.body.id,
      radiographId: newer,
      boneLevelMm: 2.9,
      takenOn: '2024-03-01',
    });
    expect(offer.measuredBy).toMatch(/\S/);
    const today = context.body.today as string;

    const disagree = await visit(today, [exam(site, { boneLevelMm: 3.4, boneLevelMeasurementId: latest.body.id })]);
    expect(disagree.status).toBe(400);
    expect(disagree.body.fields['exams.0.boneLevelMm']).toMatch(/2\.9 mm/);
    const foreign = await visit(today, [exam(site, { boneLevelMm: 2.9, boneLevelMeasurementId: newer })]);
    expect(foreign.status).toBe(400);
    expect(foreign.body.fields['exams.0.boneLevelMeasurementId']).toMatch(/not a current/);

    const accepted = await visit(today, [exam(site, { boneLevelMm: 2.9, boneLevelMeasurementId: latest.body.id })]);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    expect(accepted.body.exams[0]).toMatchObject({ boneLevelMm: 2.9, boneLevelMeasurementId: latest.body.id });
    const amended = await ctx.http
      .post(`/api/recalls/exams/${accepted.body.exams[0].id}/amend`)
      .set('Cookie', hygienist)
      .send({ ...exam(site, { boneLevelMm: 3.1 }), siteId: undefined, amendmentReason: 'Read again on the monitor' });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({ boneLevelMm: 3.1, boneLevelMeasurementId: null });
    // The chart's ICOI grade reads the latest exam's findings.
    const levels = await boneLevels(dentist, site);
    expect(levels.body.icoi.reasons.join(' ')).toContain('deepest probing depth 3 mm');
  });

  it('a measurement on a radiograph entered in error is neither offered nor accepted', async () => {
    const site = await newSite();
    const radiograph = await upload(site, '2024-04-01');
    const m = await measure(dentist, radiograph, site);
    expect(m.status).toBe(201);
    await ctx.http
      .post(`/api/radiographs/${radiograph}/entered-in-error`)
      .set('Cookie', dentist)
      .send({ reason: 'Wrong side' });
    const context = await ctx.http.get(`/api/recalls/patients/${lucia}/exam-context`).set('Cookie', hygienist);
    expect(context.body.sites.find((s: { siteId: string }) => s.siteId === site).measuredBoneLevels).toEqual([]);
    const res = await visit(context.body.today, [exam(site, { boneLevelMm: 1.2, boneLevelMeasurementId: m.body.id })]);
    expect(res.status).toBe(400);
  });

  it('a back-dated exam may cite only a radiograph taken on or before its day', async () => {
    const site = await newSite();
    const older = await upload(site, '2022-03-01');
    const newer = await upload(site, '2024-03-01');
    const first = await measure(dentist, older, site, { points: points(20, 40) });
    const second = await measure(hygienist, newer, site, { points: points(30, 50) });
    expect([first.status, second.status]).toEqual([201, 201]);
    const context = await ctx.http.get(`/api/recalls/patients/${lucia}/exam-context`).set('Cookie', hygienist);
    const offers = context.body.sites.find((s: { siteId: string }) => s.siteId === site).measuredBoneLevels as {
      measurementId: string;
      boneLevelMm: number;
    }[];
    const ofOlder = offers.find((o) => o.measurementId === first.body.id)!;
    const ofNewer = offers.find((o) => o.measurementId === second.body.id)!;

    // An exam of 2023: the 2024 film did not exist yet.
    const later = await visit('2023-06-01', [
      exam(site, { boneLevelMm: ofNewer.boneLevelMm, boneLevelMeasurementId: ofNewer.measurementId }),
    ]);
    expect(later.status).toBe(400);
    expect(later.body.fields['exams.0.boneLevelMeasurementId']).toMatch(/taken after this exam of 1 Jun 2023/);
    const earlier = await visit('2023-06-01', [
      exam(site, { boneLevelMm: ofOlder.boneLevelMm, boneLevelMeasurementId: ofOlder.measurementId }),
    ]);
    expect(earlier.status, JSON.stringify(earlier.body)).toBe(201);
    expect(earlier.body.exams[0]).toMatchObject({ examinedOn: '2023-06-01', boneLevelMeasurementId: first.body.id });
  });
});
