// Security review: practice isolation through ids in bodies (not only in paths), the surgeon's
// share scope on every route that reads patient data, role rules, and CSV/e-mail hygiene.
// Quarry Hill Dental is the unrelated practice; Dr Imbert (Northgate surgeon) is shared into
// LL-1001, LL-1002, LL-1004 and LL-1005 but not LL-1003.
import { and, eq, isNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  complications,
  componentInstances,
  components,
  implantSites,
  patientShares,
  patients,
  placements,
  practices,
  recallExams,
  restorations,
  torqueEvents,
  torqueWrenches,
  users,
} from '../src/db/schema/index.js';
import { larkspurId, parts, patientWithPart, platformId } from './support/ledger-fixtures.js';
import {
  ACCOUNTS,
  type AccountKey,
  patientId,
  signIn,
  signInAll,
  siteId,
  startTestApp,
  type TestContext,
} from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let tex: (suffix: string) => string;
let quarryMhx: (suffix: string) => string;
let larkspurMhx: (suffix: string) => string;

const POSITIONS = ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const;
const healthyExam = (site: string) => ({
  siteId: site,
  sites: POSITIONS.map((position) => ({ position, probingDepthMm: 3, bleeding: false, suppuration: false })),
  mobility: false,
  plaqueIndex: 0,
  bleedingIndex: 0,
});

/** A valid two-implant plan for Wendell (LL-1005, Tessely EX 4.1 at 15 and 16). */
const wendellPlan = (over: { screw?: string; coping?: string; sites?: string[] } = {}) => ({
  patientId: ids.wendell,
  kind: 'splinted-bridge',
  retention: 'screw-to-implant',
  material: 'zirconia',
  copingsSplinted: true,
  sites: (over.sites ?? [ids.wendell15, ids.wendell16]).map((s) => ({
    siteId: s,
    interface: 'non-engaging',
    impressionCoping: 'non-engaging',
    screwComponentIds: [over.screw ?? tex('PSI')],
    impressionCopingComponentId: over.coping ?? tex('ICN-O'),
  })),
});

async function freshPlan(): Promise<string> {
  const res = await ctx.http.post('/api/restorations').set('Cookie', cookies.dentist).send(wendellPlan());
  if (res.status !== 201) throw new Error(`fixture plan failed: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

async function componentOf(practiceId: string, kind: string): Promise<string> {
  const [row] = await ctx.db
    .select({ id: components.id })
    .from(components)
    .where(and(eq(components.practiceId, practiceId), eq(components.kind, kind as never)));
  return row.id;
}

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  const larkspur = await larkspurId(ctx.db);
  const [quarry] = await ctx.db
    .select({ id: practices.id })
    .from(practices)
    .where(eq(practices.name, 'Quarry Hill Dental'));
  ids.larkspur = larkspur;
  ids.quarry = quarry.id;
  tex = await parts(ctx.db, larkspur, 'Tessely EX 4.1');
  quarryMhx = await parts(ctx.db, quarry.id, 'Miravik HX 4.1');
  larkspurMhx = await parts(ctx.db, larkspur, 'Miravik HX 4.1');
  ids.harold = await patientId(ctx.db, 'LL-1001');
  ids.okafor = await patientId(ctx.db, 'LL-1003');
  ids.ferraz = await patientId(ctx.db, 'LL-1004');
  ids.wendell = await patientId(ctx.db, 'LL-1005');
  ids.qh1 = await patientId(ctx.db, 'QH-2001');
  ids.qh2 = await patientId(ctx.db, 'QH-2002');
  ids.harold35 = await siteId(ctx.db, 'LL-1001', 35);
  ids.okafor46 = await siteId(ctx.db, 'LL-1003', 46);
  ids.ferraz14 = await siteId(ctx.db, 'LL-1004', 14);
  ids.wendell15 = await siteId(ctx.db, 'LL-1005', 15);
  ids.wendell16 = await siteId(ctx.db, 'LL-1005', 16);
  ids.qh36 = await siteId(ctx.db, 'QH-2001', 36);
  ids.qh11 = await siteId(ctx.db, 'QH-2002', 11);
  const screwAt = async (site: string) =>
    (
      await ctx.db
        .select({ id: componentInstances.id })
        .from(componentInstances)
        .innerJoin(components, eq(components.id, componentInstances.componentId))
        .where(
          and(
            eq(componentInstances.siteId, site),
            isNull(componentInstances.removedOn),
            eq(components.kind, 'abutment-screw'),
          ),
        )
    )[0].id;
  ids.okaforScrew = await screwAt(ids.okafor46);
  ids.ferrazScrew = await screwAt(ids.ferraz14);
  ids.larkspurWrench = (
    await ctx.db.select({ id: torqueWrenches.id }).from(torqueWrenches).where(eq(torqueWrenches.practiceId, larkspur))
  )[0].id;
  ids.quarryWrench = (
    await ctx.db.select({ id: torqueWrenches.id }).from(torqueWrenches).where(eq(torqueWrenches.practiceId, quarry.id))
  )[0].id;
  ids.quarryScrewPart = await componentOf(quarry.id, 'abutment-screw');
  // A part in place at Quarry Hill's QH-2001 36 (the demo has placements there but no parts yet).
  const [qhPart] = await ctx.db
    .insert(componentInstances)
    .values({
      practiceId: quarry.id,
      patientId: ids.qh1,
      siteId: ids.qh36,
      componentId: quarryMhx('AS'),
      lot: 'AS-QH-1',
      installedOn: '2022-08-01',
    })
    .returning({ id: componentInstances.id });
  ids.qhInstance = qhPart.id;
});
afterAll(() => ctx.close());

describe('practice isolation through ids in request bodies', () => {
  it('POST /restorations: a part of another practice’s catalogue is refused (400) and nothing is saved', async () => {
    // Other tests of this file plan on Wendell too: count his plans before, whichever ran first.
    const plans = async () =>
      (await ctx.http.get(`/api/patients/${ids.wendell}/restorations`).set('Cookie', cookies.dentist)).body
        .items as unknown[];
    const before = (await plans()).length;
    const res = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send(wendellPlan({ screw: ids.quarryScrewPart }));
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.screwComponentIds.0']).toMatch(/practice catalogue/);
    expect(await plans()).toHaveLength(before);
  });

  it('POST /restorations: Quarry Hill may not plan with Larkspur’s catalogue ids on its own patient', async () => {
    const plan = {
      patientId: ids.qh1,
      kind: 'single-crown',
      retention: 'screw-to-implant',
      material: 'zirconia',
      sites: [
        {
          siteId: ids.qh36,
          interface: 'engaging',
          impressionCoping: 'engaging',
          screwComponentIds: [larkspurMhx('PSI')],
        },
      ],
    };
    const res = await ctx.http.post('/api/restorations').set('Cookie', cookies.otherPracticeDentist).send(plan);
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.screwComponentIds.0']).toMatch(/practice catalogue/);
  });

  it('POST /restorations: a site of another practice, or of another patient, is not a site of this patient (400)', async () => {
    for (const foreign of [ids.qh36, ids.harold35]) {
      const res = await ctx.http
        .post('/api/restorations')
        .set('Cookie', cookies.dentist)
        .send(wendellPlan({ sites: [ids.wendell15, foreign] }));
      expect(res.status).toBe(400);
      expect(res.body.fields['sites.1.siteId']).toMatch(/Not an implant site of this patient/);
    }
  });

  it('POST /restorations: another practice’s patient in the body answers 404', async () => {
    const res = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.otherPracticeDentist)
      .send(wendellPlan());
    expect(res.status).toBe(404);
  });

  it('POST /restorations/:id/amendments: a foreign part in the amended plan is refused', async () => {
    const id = await freshPlan();
    const { patientId: _p, ...rest } = wendellPlan({ coping: quarryMhx('ICN-O') });
    const res = await ctx.http
      .post(`/api/restorations/${id}/amendments`)
      .set('Cookie', cookies.dentist)
      .send({ ...rest, amendmentReason: 'Other coping' });
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.impressionCopingComponentId']).toMatch(/practice catalogue/);
  });

  it('POST /restorations/:id/delivery: a delivery dated in the future, or before its impression, is refused and nothing is delivered', async () => {
    const id = await freshPlan();
    const part = { siteId: ids.wendell15, componentId: tex('PSI'), lot: 'X-1' };
    const future = await ctx.http
      .post(`/api/restorations/${id}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({ deliveredOn: '2099-01-01', parts: [part] });
    expect(future.status).toBe(400);
    expect(future.body.fields.deliveredOn).toBe('Cannot be in the future');
    const backwards = await ctx.http
      .post(`/api/restorations/${id}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({ deliveredOn: '2026-11-20', impressionTakenOn: '2026-11-25', parts: [part] });
    expect(backwards.status).toBe(400);
    expect(backwards.body.fields).toHaveProperty('impressionTakenOn');
    expect((await ctx.http.get(`/api/restorations/${id}`).set('Cookie', cookies.dentist)).body.status).toBe('planned');
  });

  it('POST /restorations/:id/delivery: the same part listed twice for one site is refused and nothing is delivered', async () => {
    const id = await freshPlan();
    const part = { siteId: ids.wendell15, componentId: tex('PSI'), lot: 'X-1' };
    const res = await ctx.http
      .post(`/api/restorations/${id}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({ deliveredOn: '2026-11-30', parts: [part, part] });
    expect(res.status).toBe(400);
    expect(res.body.fields['parts.1.componentId']).toMatch(/listed twice for 15/);
    expect((await ctx.http.get(`/api/restorations/${id}`).set('Cookie', cookies.dentist)).body.status).toBe('planned');
  });

  it('POST /restorations/:id/delivery: a foreign part or a site outside the restoration is refused and nothing is delivered', async () => {
    const id = await freshPlan();
    const foreignPart = await ctx.http
      .post(`/api/restorations/${id}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({
        deliveredOn: '2026-11-30',
        parts: [{ siteId: ids.wendell15, componentId: ids.quarryScrewPart, lot: 'X-1' }],
      });
    expect(foreignPart.status).toBe(400);
    expect(foreignPart.body.fields['parts.0.componentId']).toMatch(/practice catalogue/);
    const foreignSite = await ctx.http
      .post(`/api/restorations/${id}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({ deliveredOn: '2026-11-30', parts: [{ siteId: ids.qh36, componentId: tex('PSI'), lot: 'X-1' }] });
    expect(foreignSite.status).toBe(400);
    expect(foreignSite.body.fields['parts.0.siteId']).toMatch(/not part of the restoration/);
    const detail = await ctx.http.get(`/api/restorations/${id}`).set('Cookie', cookies.dentist);
    expect(detail.body.status).toBe('planned');
    const onQh = await ctx.db
      .select({ id: componentInstances.id })
      .from(componentInstances)
      .where(eq(componentInstances.siteId, ids.qh36));
    expect(onQh).toHaveLength(1);
  });

  it('POST /torque-events: another practice’s part instance answers 404, in both directions', async () => {
    const fromQh = await ctx.http
      .post('/api/torque-events')
      .set('Cookie', cookies.otherPracticeDentist)
      .send({ componentInstanceId: ids.ferrazScrew, appliedNcm: 25, reason: 're-torque-at-recall' });
    expect(fromQh.status).toBe(404);
    const fromLl = await ctx.http
      .post('/api/torque-events')
      .set('Cookie', cookies.dentist)
      .send({ componentInstanceId: ids.qhInstance, appliedNcm: 30, reason: 're-torque-at-recall' });
    expect(fromLl.status).toBe(404);
  });

  it('POST /torque-events and amendments: a wrench of another practice is refused (400)', async () => {
    const log = await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
      componentInstanceId: ids.ferrazScrew,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      wrenchId: ids.quarryWrench,
    });
    expect(log.status).toBe(400);
    expect(log.body.fields.wrenchId).toMatch(/Not a torque wrench of this practice/);
    const ok = await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
      componentInstanceId: ids.ferrazScrew,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      wrenchId: ids.larkspurWrench,
      performedAt: '2025-05-05T10:00:00Z',
    });
    expect(ok.status).toBe(201);
    const amend = await ctx.http
      .post(`/api/torque-events/${ok.body.id}/amendments`)
      .set('Cookie', cookies.dentist)
      .send({
        appliedNcm: 24,
        performedAt: '2025-05-05T10:00:00Z',
        wrenchId: ids.quarryWrench,
        amendmentReason: 'Other wrench',
      });
    expect(amend.status).toBe(400);
    expect(amend.body.fields.wrenchId).toMatch(/Not a torque wrench of this practice/);
    // Quarry Hill may not amend Larkspur's entry at all.
    const qh = await ctx.http
      .post(`/api/torque-events/${ok.body.id}/amendments`)
      .set('Cookie', cookies.otherPracticeDentist)
      .send({ appliedNcm: 24, performedAt: '2025-05-05T10:00:00Z', amendmentReason: 'Not mine' });
    expect(qh.status).toBe(404);
  });

  it('POST /complications: another practice’s site is 404; a part of another site or practice is 400', async () => {
    const foreignSite = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.otherPracticeDentist)
      .send({ siteId: ids.ferraz14, kind: 'other', occurredOn: '2025-01-01' });
    expect(foreignSite.status).toBe(404);
    for (const part of [ids.qhInstance, ids.okaforScrew]) {
      const res = await ctx.http
        .post('/api/complications')
        .set('Cookie', cookies.dentist)
        .send({ siteId: ids.ferraz14, componentInstanceId: part, kind: 'screw-loosening', occurredOn: '2025-01-01' });
      expect(res.status).toBe(400);
      expect(res.body.fields.componentInstanceId).toMatch(/Not a part at this site/);
    }
    const ok = await ctx.http.post('/api/complications').set('Cookie', cookies.dentist).send({
      siteId: ids.ferraz14,
      componentInstanceId: ids.ferrazScrew,
      kind: 'screw-loosening',
      occurredOn: '2025-01-01',
    });
    expect(ok.status).toBe(201);
    const amend = await ctx.http
      .post(`/api/complications/${ok.body.id}/amendments`)
      .set('Cookie', cookies.dentist)
      .send({
        componentInstanceId: ids.qhInstance,
        kind: 'screw-loosening',
        occurredOn: '2025-01-01',
        amendmentReason: 'Other part',
      });
    expect(amend.status).toBe(400);
    const qh = await ctx.http
      .post(`/api/complications/${ok.body.id}/amendments`)
      .set('Cookie', cookies.otherPracticeDentist)
      .send({ kind: 'other', occurredOn: '2025-01-01', amendmentReason: 'Not mine' });
    expect(qh.status).toBe(404);
  });

  it('catalogue: a platform under another practice’s system, or a part under its platform, answers 404', async () => {
    const [qhPlacement] = await ctx.db
      .select({ platformId: placements.platformId })
      .from(placements)
      .where(eq(placements.siteId, ids.qh36));
    const qhPlatform = qhPlacement.platformId;
    const qhSystemId = (await ctx.http.get('/api/catalogue').set('Cookie', cookies.otherPracticeDentist)).body
      .systems[0].id as string;
    const platform = await ctx.http.post('/api/catalogue/platforms').set('Cookie', cookies.practice_admin).send({
      systemId: qhSystemId,
      name: 'Foreign 5.0',
      diameterMm: 5,
      connection: 'internal-hex',
      platformShift: false,
    });
    expect(platform.status).toBe(404);
    const part = await ctx.http.post('/api/catalogue/components').set('Cookie', cookies.practice_admin).send({
      platformId: qhPlatform,
      kind: 'abutment-screw',
      name: 'Foreign screw',
      referenceCode: 'F-1',
      torqueSpecNcm: 30,
    });
    expect(part.status).toBe(404);
    const patch = await ctx.http
      .patch(`/api/catalogue/components/${ids.quarryScrewPart}`)
      .set('Cookie', cookies.practice_admin)
      .send({ torqueSpecNcm: 99 });
    expect(patch.status).toBe(404);
    const patchPlatform = await ctx.http
      .patch(`/api/catalogue/platforms/${qhPlatform}`)
      .set('Cookie', cookies.practice_admin)
      .send({ diameterMm: 9 });
    expect(patchPlatform.status).toBe(404);
    const [unchanged] = await ctx.db
      .select({ torqueSpecNcm: components.torqueSpecNcm })
      .from(components)
      .where(eq(components.id, ids.quarryScrewPart));
    expect(unchanged.torqueSpecNcm).toBe(30);
    // Each practice's catalogue lists only its own rows.
    const own = await ctx.http.get('/api/catalogue').set('Cookie', cookies.dentist);
    const platformIds = own.body.systems.flatMap((s: { platforms: { id: string }[] }) => s.platforms.map((p) => p.id));
    expect(platformIds).not.toContain(qhPlatform);
    expect(platformIds).toContain(await platformId(ctx.db, ids.larkspur, 'Miravik HX 4.1'));
  });

  it('POST /recalls/visits: another practice’s patient is 404; a foreign or other patient’s site in the body is 400', async () => {
    const foreignPatient = await ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.hygienist)
      .send({ patientId: ids.qh1, examinedOn: '2025-01-01', exams: [healthyExam(ids.qh36)] });
    expect(foreignPatient.status).toBe(404);
    for (const site of [ids.qh36, ids.harold35]) {
      const res = await ctx.http
        .post('/api/recalls/visits')
        .set('Cookie', cookies.hygienist)
        .send({
          patientId: ids.ferraz,
          examinedOn: '2025-01-01',
          exams: [healthyExam(ids.ferraz14), healthyExam(site)],
        });
      expect(res.status).toBe(400);
      expect(res.body.fields['exams.1.siteId']).toMatch(/not an implant site of this patient/);
    }
  });
});

describe('share scope of the Northgate surgeon', () => {
  it('the patient list holds his own practice’s patients and the shared ones, never LL-1003 or Quarry Hill', async () => {
    const res = await ctx.http.get('/api/patients').set('Cookie', cookies.surgeon);
    const charts = res.body.items.map((p: { chartNumber: string }) => p.chartNumber);
    expect(charts).toEqual(expect.arrayContaining(['LL-1001', 'LL-1002', 'LL-1004', 'LL-1005']));
    expect(charts).not.toContain('LL-1003');
    expect(charts.some((c: string) => c.startsWith('QH-'))).toBe(false);
  });

  it('Recall desk and its CSV never carry an unshared patient', async () => {
    const desk = await ctx.http.get('/api/recalls/desk?pageSize=200').set('Cookie', cookies.surgeon);
    expect(desk.status).toBe(200);
    const charts = desk.body.items.map((r: { chartNumber: string }) => r.chartNumber);
    expect(charts).toContain('LL-1001');
    expect(charts).not.toContain('LL-1003');
    expect(charts.some((c: string) => c.startsWith('QH-'))).toBe(false);
    const csv = await ctx.http.get('/api/recalls/desk/csv').set('Cookie', cookies.surgeon);
    expect(csv.status).toBe(200);
    expect(csv.text).toContain('LL-1001');
    expect(csv.text).not.toContain('LL-1003');
    expect(csv.text).not.toContain('Okafor');
    expect(csv.text).not.toContain('QH-');
    const search = await ctx.http.get('/api/recalls/desk?search=Okafor').set('Cookie', cookies.surgeon);
    expect(search.body.items).toHaveLength(0);
  });

  it('exam context, exam history, timeline, site file, restorations and lab PDFs of the unshared LL-1003 answer 404', async () => {
    const crown = (await ctx.http.get(`/api/patients/${ids.okafor}/restorations`).set('Cookie', cookies.dentist)).body
      .items[0].id as string;
    const lab = await ctx.http
      .post(`/api/restorations/${crown}/lab-prescriptions`)
      .set('Cookie', cookies.dentist)
      .send({});
    expect(lab.status).toBe(201);
    const paths = [
      `/api/patients/${ids.okafor}`,
      `/api/recalls/patients/${ids.okafor}/exam-context`,
      `/api/recalls/sites/${ids.okafor46}/exams`,
      `/api/sites/${ids.okafor46}`,
      `/api/sites/${ids.okafor46}/timeline`,
      `/api/patients/${ids.okafor}/restorations`,
      `/api/patients/${ids.okafor}/restorable-sites`,
      `/api/restorations/${crown}`,
      `/api/lab-prescriptions/${lab.body.id}/pdf`,
    ];
    for (const path of paths) {
      const res = await ctx.http.get(path).set('Cookie', cookies.surgeon);
      expect(res.status, path).toBe(404);
      const own = await ctx.http.get(path).set('Cookie', cookies.dentist);
      expect(own.status, path).toBe(200);
    }
  });

  it('a revoked share closes the patient at once, desk included', async () => {
    const surgeon = await signIn(ctx, 'surgeon');
    expect((await ctx.http.get(`/api/sites/${ids.ferraz14}/timeline`).set('Cookie', surgeon)).status).toBe(200);
    await ctx.db.update(patientShares).set({ revokedAt: new Date() }).where(eq(patientShares.patientId, ids.ferraz));
    try {
      expect((await ctx.http.get(`/api/patients/${ids.ferraz}`).set('Cookie', surgeon)).status).toBe(404);
      expect((await ctx.http.get(`/api/sites/${ids.ferraz14}/timeline`).set('Cookie', surgeon)).status).toBe(404);
      expect((await ctx.http.get(`/api/recalls/sites/${ids.ferraz14}/exams`).set('Cookie', surgeon)).status).toBe(404);
      const csv = await ctx.http.get('/api/recalls/desk/csv').set('Cookie', surgeon);
      expect(csv.text).not.toContain('LL-1004');
    } finally {
      await ctx.db.update(patientShares).set({ revokedAt: null }).where(eq(patientShares.patientId, ids.ferraz));
    }
  });

  it('a share row naming a user who is not a surgeon opens nothing: lists, desk and CSV stay within the practice', async () => {
    const [nell] = await ctx.db
      .select({ id: users.id })
      .from(users)
      .where(eq(users.email, ACCOUNTS.otherPracticeDentist));
    const [ines] = await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, ACCOUNTS.dentist));
    const [share] = await ctx.db
      .insert(patientShares)
      .values({ practiceId: ids.larkspur, patientId: ids.okafor, sharedWithUserId: nell.id, sharedByUserId: ines.id })
      .returning({ id: patientShares.id });
    try {
      const qh = await signIn(ctx, 'otherPracticeDentist');
      const list = await ctx.http.get('/api/patients').set('Cookie', qh);
      expect(list.body.items.map((p: { chartNumber: string }) => p.chartNumber).sort()).toEqual(['QH-2001', 'QH-2002']);
      const desk = await ctx.http.get('/api/recalls/desk?pageSize=200').set('Cookie', qh);
      expect(desk.body.items.map((r: { chartNumber: string }) => r.chartNumber)).not.toContain('LL-1003');
      expect(desk.body.total).toBe(2);
      const csv = await ctx.http.get('/api/recalls/desk/csv').set('Cookie', qh);
      expect(csv.text).not.toContain('Okafor');
      expect((await ctx.http.get(`/api/patients/${ids.okafor}`).set('Cookie', qh)).status).toBe(404);
      expect((await ctx.http.get(`/api/sites/${ids.okafor46}/timeline`).set('Cookie', qh)).status).toBe(404);
    } finally {
      await ctx.db.update(patientShares).set({ revokedAt: new Date() }).where(eq(patientShares.id, share.id));
    }
  });

  it('the surgeon reads a shared patient’s ledger but changes none of it (403)', async () => {
    expect((await ctx.http.get(`/api/sites/${ids.ferraz14}/timeline`).set('Cookie', cookies.surgeon)).status).toBe(200);
    const torque = await ctx.http
      .post('/api/torque-events')
      .set('Cookie', cookies.surgeon)
      .send({ componentInstanceId: ids.ferrazScrew, appliedNcm: 25, reason: 're-torque-at-recall' });
    expect(torque.status).toBe(403);
    const complication = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.surgeon)
      .send({ siteId: ids.ferraz14, kind: 'other', occurredOn: '2025-01-01' });
    expect(complication.status).toBe(403);
    const visit = await ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.surgeon)
      .send({ patientId: ids.ferraz, examinedOn: '2025-01-01', exams: [healthyExam(ids.ferraz14)] });
    expect(visit.status).toBe(403);
  });
});

describe('what the exam form context tells each role', () => {
  it('gives the practice policy to the hygienist, and not to the surgeon of a shared patient', async () => {
    const hygienist = await ctx.http
      .get(`/api/recalls/patients/${ids.harold}/exam-context`)
      .set('Cookie', cookies.hygienist);
    expect(hygienist.status).toBe(200);
    expect(hygienist.body.policy).toMatchObject({ baseMonths: 6, riskMonths: 3 });
    const surgeon = await ctx.http
      .get(`/api/recalls/patients/${ids.harold}/exam-context`)
      .set('Cookie', cookies.surgeon);
    expect(surgeon.status).toBe(200);
    // The share's field rules leave the practice's policy out of the reply (issue 12).
    expect(surgeon.body).not.toHaveProperty('policy');
    expect(surgeon.body.sites.length).toBeGreaterThan(0);
  });
});

describe('role rules', () => {
  it('only the dentist writes restorations, parts and torque; only the hygienist and the dentist record exams', async () => {
    for (const who of ['hygienist', 'surgeon', 'practice_admin'] as const) {
      expect(
        (await ctx.http.post('/api/restorations').set('Cookie', cookies[who]).send(wendellPlan())).status,
        who,
      ).toBe(403);
      expect(
        (
          await ctx.http
            .post('/api/torque-events')
            .set('Cookie', cookies[who])
            .send({ componentInstanceId: ids.ferrazScrew, appliedNcm: 25, reason: 're-torque-at-recall' })
        ).status,
        who,
      ).toBe(403);
    }
    const plan = await freshPlan();
    for (const who of ['hygienist', 'surgeon', 'practice_admin'] as const) {
      const res = await ctx.http
        .post(`/api/restorations/${plan}/delivery`)
        .set('Cookie', cookies[who])
        .send({ deliveredOn: '2026-11-30', parts: [{ siteId: ids.wendell15, componentId: tex('PSI'), lot: 'L-1' }] });
      expect(res.status, who).toBe(403);
    }
    for (const who of ['surgeon', 'practice_admin'] as const) {
      const res = await ctx.http
        .post('/api/recalls/visits')
        .set('Cookie', cookies[who])
        .send({ patientId: ids.ferraz, examinedOn: '2025-01-01', exams: [healthyExam(ids.ferraz14)] });
      expect(res.status, who).toBe(403);
    }
    for (const who of ['dentist', 'hygienist', 'surgeon'] as const) {
      expect(
        (
          await ctx.http
            .put('/api/recalls/policy')
            .set('Cookie', cookies[who])
            .send({ baseMonths: 6, riskMonths: 3, reminderDaysBefore: 14, overdueReminderDaysAfter: 7 })
        ).status,
        who,
      ).toBe(403);
      expect(
        (await ctx.http.post('/api/wrenches').set('Cookie', cookies[who]).send({ label: 'W', type: 'spring' })).status,
        who,
      ).toBe(403);
    }
  });
});

describe('history is never forked or doubled by concurrent saves', () => {
  const statuses = (replies: { status: number }[]) => replies.map((r) => r.status).sort((a, b) => a - b);

  it('POST /restorations/:id/delivery: of concurrent deliveries of one plan only one goes through (409 for the rest)', async () => {
    const id = await freshPlan();
    const body = {
      deliveredOn: '2026-11-30',
      parts: [{ siteId: ids.wendell15, componentId: tex('PSI'), lot: 'PSI-1' }],
    };
    const replies = await Promise.all(
      [1, 2, 3, 4].map(() =>
        ctx.http.post(`/api/restorations/${id}/delivery`).set('Cookie', cookies.dentist).send(body),
      ),
    );
    expect(statuses(replies)).toEqual([200, 409, 409, 409]);
    const installed = await ctx.db
      .select({ id: componentInstances.id })
      .from(componentInstances)
      .where(eq(componentInstances.restorationId, id));
    expect(installed).toHaveLength(1);
  });

  it('POST /restorations/:id/amendments: concurrent amendments of one version leave one current version', async () => {
    const id = await freshPlan();
    const { patientId: _p, ...rest } = wendellPlan();
    const replies = await Promise.all(
      [1, 2, 3, 4].map((i) =>
        ctx.http
          .post(`/api/restorations/${id}/amendments`)
          .set('Cookie', cookies.dentist)
          .send({ ...rest, amendmentReason: `Amendment ${i}` }),
      ),
    );
    expect(statuses(replies)).toEqual([201, 409, 409, 409]);
    const amendments = await ctx.db
      .select({ id: restorations.id })
      .from(restorations)
      .where(eq(restorations.supersedesId, id));
    expect(amendments).toHaveLength(1);
  });

  it('a plan amended and delivered at the same time: not both', async () => {
    const id = await freshPlan();
    const { patientId: _p, ...rest } = wendellPlan();
    const [amend, deliver] = await Promise.all([
      ctx.http
        .post(`/api/restorations/${id}/amendments`)
        .set('Cookie', cookies.dentist)
        .send({ ...rest, amendmentReason: 'Shade' }),
      ctx.http
        .post(`/api/restorations/${id}/delivery`)
        .set('Cookie', cookies.dentist)
        .send({ deliveredOn: '2026-11-30', parts: [{ siteId: ids.wendell15, componentId: tex('PSI'), lot: 'PSI-2' }] }),
    ]);
    expect([amend.status, deliver.status].filter((s) => s === 409)).toHaveLength(1);
  });

  it('POST /torque-events/:id/amendments and POST /complications/:id/amendments: one amendment per version under concurrency', async () => {
    const torque = await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
      componentInstanceId: ids.ferrazScrew,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      performedAt: '2025-06-06T10:00:00Z',
    });
    const t = await Promise.all(
      [1, 2, 3, 4].map(() =>
        ctx.http
          .post(`/api/torque-events/${torque.body.id}/amendments`)
          .set('Cookie', cookies.dentist)
          .send({ appliedNcm: 24, performedAt: '2025-06-06T10:00:00Z', amendmentReason: 'Typed 25, read 24' }),
      ),
    );
    expect(statuses(t)).toEqual([201, 409, 409, 409]);
    expect(
      await ctx.db
        .select({ id: torqueEvents.id })
        .from(torqueEvents)
        .where(eq(torqueEvents.supersedesId, torque.body.id)),
    ).toHaveLength(1);
    const complication = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.dentist)
      .send({ siteId: ids.ferraz14, kind: 'other', occurredOn: '2025-01-01' });
    const c = await Promise.all(
      [1, 2, 3, 4].map(() =>
        ctx.http
          .post(`/api/complications/${complication.body.id}/amendments`)
          .set('Cookie', cookies.dentist)
          .send({ kind: 'screw-loosening', occurredOn: '2025-01-01', amendmentReason: 'Wrong kind' }),
      ),
    );
    expect(statuses(c)).toEqual([201, 409, 409, 409]);
    expect(
      await ctx.db
        .select({ id: complications.id })
        .from(complications)
        .where(eq(complications.supersedesId, complication.body.id)),
    ).toHaveLength(1);
  });

  it('POST /torque-events (screw-replaced): one replacement of a part under concurrency', async () => {
    // A screw of its own: retiring Lucía Ferraz's would refuse the torque entries of other tests.
    const { instanceId: screw } = await patientWithPart(ctx, 'T-SR1', 'Solvra CN 4.3', 'PSI');
    const body = {
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 'screw-replaced',
      replacementLot: 'AS-NEW-1',
      performedAt: '2026-11-07T10:00:00Z',
    };
    const replies = await Promise.all(
      [1, 2, 3].map(() => ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send(body)),
    );
    expect(statuses(replies)).toEqual([201, 409, 409]);
    expect(
      await ctx.db
        .select({ id: componentInstances.id })
        .from(componentInstances)
        .where(eq(componentInstances.replacesId, screw)),
    ).toHaveLength(1);
  });

  it('POST /recalls/exams/:id/amend: one amendment per exam under concurrency', async () => {
    const visit = await ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.hygienist)
      .send({ patientId: ids.ferraz, examinedOn: '2025-01-02', exams: [healthyExam(ids.ferraz14)] });
    expect(visit.status).toBe(201);
    const examId = visit.body.exams[0].id as string;
    const { siteId: _s, ...exam } = healthyExam(ids.ferraz14);
    const replies = await Promise.all(
      [1, 2, 3, 4].map(() =>
        ctx.http
          .post(`/api/recalls/exams/${examId}/amend`)
          .set('Cookie', cookies.hygienist)
          .send({ ...exam, amendmentReason: 'Probe misread' }),
      ),
    );
    expect(statuses(replies)).toEqual([201, 409, 409, 409]);
    expect(
      await ctx.db.select({ id: recallExams.id }).from(recallExams).where(eq(recallExams.supersedesId, examId)),
    ).toHaveLength(1);
  });
});

describe('implant axes are bounded', () => {
  it('refuses an axis component beyond ±1000 in a plan, naming the field', async () => {
    const plan = wendellPlan();
    plan.sites[0] = { ...plan.sites[0], axis: [1e308, 0, 1] } as (typeof plan.sites)[number];
    const res = await ctx.http.post('/api/restorations').set('Cookie', cookies.dentist).send(plan);
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.axis.0']).toMatch(/between −1000 and 1000/);
  });
});

describe('CSV and input hygiene', () => {
  it('Recall desk CSV neutralises cells that a spreadsheet would run as a formula', async () => {
    const [p] = await ctx.db
      .insert(patients)
      .values({
        practiceId: ids.larkspur,
        chartNumber: '+LL-9001',
        givenName: '=HYPERLINK("http://evil.example","x")',
        familyName: 'Tester',
        birthDate: '1970-01-01',
      })
      .returning({ id: patients.id });
    await ctx.db.insert(implantSites).values({ practiceId: ids.larkspur, patientId: p.id, fdi: 21, status: 'placed' });
    const [q] = await ctx.db
      .insert(patients)
      .values({
        practiceId: ids.larkspur,
        chartNumber: '@LL-9002',
        givenName: '-2+3',
        familyName: 'Minus',
        birthDate: '1970-01-01',
      })
      .returning({ id: patients.id });
    await ctx.db.insert(implantSites).values({ practiceId: ids.larkspur, patientId: q.id, fdi: 22, status: 'placed' });
    const csv = await ctx.http.get('/api/recalls/desk/csv').set('Cookie', cookies.dentist);
    expect(csv.status).toBe(200);
    const cells = csv.text.split('\r\n').flatMap((line) => line.split(','));
    for (const cell of cells) expect(cell.replace(/^"/, '')).not.toMatch(/^[=+\-@]/);
    expect(csv.text).toContain(`'+LL-9001`);
    expect(csv.text).toContain(`'@LL-9002`);
    expect(csv.text).toContain(`'-2+3 Minus`);
    expect(csv.text).toContain(`"'=HYPERLINK(""http://evil.example"",""x"") Tester"`);
  });

  it('over-long strings and arrays in bodies are refused (400) before they reach the database', async () => {
    const longNotes = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.dentist)
      .send({ siteId: ids.ferraz14, kind: 'other', occurredOn: '2025-01-01', notes: 'x'.repeat(2001) });
    expect(longNotes.status).toBe(400);
    const manySites = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send({ ...wendellPlan(), sites: Array.from({ length: 17 }, () => wendellPlan().sites[0]) });
    expect(manySites.status).toBe(400);
    const longSearch = await ctx.http.get(`/api/recalls/desk?search=${'a'.repeat(101)}`).set('Cookie', cookies.dentist);
    expect(longSearch.status).toBe(400);
    const badSort = await ctx.http
      .get('/api/recalls/desk?sort=family_name;drop table patients')
      .set('Cookie', cookies.dentist);
    expect(badSort.status).toBe(400);
    const longLabel = await ctx.http
      .post('/api/wrenches')
      .set('Cookie', cookies.practice_admin)
      .send({ label: 'w'.repeat(121), type: 'spring' });
    expect(longLabel.status).toBe(400);
    const labEmail = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send({ ...wendellPlan(), labEmail: 'lab@example.com\r\nBcc: victim@example.com' });
    expect(labEmail.status).toBe(400);
    expect(labEmail.body.fields.labEmail).toBeDefined();
  });

  it('POST /restorations: a lab e-mail address longer than an address can be (254) is refused, and nothing is saved', async () => {
    const res = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send({ ...wendellPlan(), labEmail: `${'a'.repeat(5000)}@example.com` });
    expect(res.status).toBe(400);
    expect(res.body.fields.labEmail).toBeDefined();
    const list = await ctx.http.get(`/api/patients/${ids.wendell}/restorations`).set('Cookie', cookies.dentist);
    expect(list.body.items.some((r: { labEmail: string | null }) => (r.labEmail ?? '').length > 254)).toBe(false);
  });
});
