// An amendment changes what it names and nothing else: a field the amendment leaves out keeps the
// amended entry's value (null clears it on purpose). The contract side of the rule is walked over
// every amendment route in packages/contracts/src/amendment.test.ts; these check the services keep.
import { apiRoutes } from '@torquetrail/contracts';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { placements, torqueWrenches } from '../src/db/schema/index.js';
import { larkspurId, parts, patientWithImplants, patientWithPart } from './support/ledger-fixtures.js';
import { signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
});
afterAll(() => ctx.close());

const post = (path: string, body: object) => ctx.http.post(path).set('Cookie', dentist).send(body);

/**
 * Every amendment route and the test that amends one field of it and checks the others are kept.
 * A new amendment route fails the walk below until it gets its case.
 */
const KEPT_FIELDS_CASES: Record<string, string> = {
  'POST /torque-events/:id/amendments': 'this file: the wrench and the time of a torque entry',
  'POST /complications/:id/amendments': 'this file: the part of a complication',
  'POST /placements/:id/amendments': 'this file: a placement amendment',
  'POST /restorations/:id/amendments': 'this file: a plan amendment',
  'POST /recalls/exams/:id/amend': 'this file: an exam amendment',
  'POST /seating-checks/:id/amendments': 'seating-checks.e2e-spec.ts: the note the amendment leaves out',
  'POST /radiograph-measurements/:id/amendments': "radiographs.e2e-spec.ts: the implant's true length is kept",
  'POST /impressions/:id/amendments': 'impressions.e2e-spec.ts: the scan bodies stay through a date-only amendment',
  'POST /insert-changes/:id/amendments':
    'insert-changes.e2e-spec.ts: the old insert and the note the amendment leaves out are kept',
};

describe('the walk of every amendment route', () => {
  it('has a kept-fields case for each amendment route of the route list', () => {
    const routes = apiRoutes
      .filter((r) => /\/amend(ments)?$/.test(r.path))
      .map((r) => `${r.method.toUpperCase()} ${r.path}`)
      .sort();
    expect(routes).toEqual(Object.keys(KEPT_FIELDS_CASES).sort());
  });
});

describe('an amendment from a small form', () => {
  it('keeps the wrench and the time of a torque entry when only the reading is corrected', async () => {
    const { instanceId } = await patientWithPart(ctx, 'T-AMK1', 'Solvra CN 4.3', 'PSI');
    const [wrench] = await ctx.db
      .select({ id: torqueWrenches.id })
      .from(torqueWrenches)
      .where(eq(torqueWrenches.practiceId, await larkspurId(ctx.db)));
    const first = await post('/api/torque-events', {
      componentInstanceId: instanceId,
      appliedNcm: 24,
      reason: 'initial-seating',
      wrenchId: wrench.id,
      performedAt: '2026-11-20T09:30:00.000Z',
    });
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body.wrenchId).not.toBeNull();

    const amended = await post(`/api/torque-events/${first.body.id}/amendments`, {
      appliedNcm: 25,
      amendmentReason: 'Misread the wrench',
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({
      appliedNcm: 25,
      wrenchId: first.body.wrenchId,
      wrenchLabel: first.body.wrenchLabel,
      performedAt: first.body.performedAt,
      reason: 'initial-seating',
      supersedesId: first.body.id,
    });

    // null is said on purpose: it clears the wrench.
    const cleared = await post(`/api/torque-events/${amended.body.id}/amendments`, {
      appliedNcm: 25,
      wrenchId: null,
      amendmentReason: 'No wrench was used',
    });
    expect(cleared.status, JSON.stringify(cleared.body)).toBe(201);
    expect(cleared.body).toMatchObject({ appliedNcm: 25, wrenchId: null, performedAt: first.body.performedAt });
  });

  it('keeps the part of a complication when the amendment leaves it out', async () => {
    const { siteId, instanceId } = await patientWithPart(ctx, 'T-AMK2', 'Solvra CN 4.3', 'PSI');
    const created = await post('/api/complications', {
      siteId,
      componentInstanceId: instanceId,
      kind: 'screw-loosening',
      occurredOn: '2026-11-02',
      notes: 'Loose at recall',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const amended = await post(`/api/complications/${created.body.id}/amendments`, {
      kind: 'screw-loosening',
      occurredOn: '2026-11-02',
      notes: 'Loose at recall; re-torqued',
      amendmentReason: 'Completed the note',
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({
      componentInstanceId: instanceId,
      kind: 'screw-loosening',
      occurredOn: '2026-11-02',
      notes: 'Loose at recall; re-torqued',
    });
  });
});

describe('an amendment from a whole form', () => {
  const POSITIONS = ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const;

  it('keeps what a placement amendment leaves out: insertion torque, ISQ, grafting, axis, notes', async () => {
    const { siteIds } = await patientWithImplants(ctx, 'T-AMK3', 'Tessely EX 4.1', [{ fdi: 36, axis: [0.1, 0, 1] }]);
    const [first] = await ctx.db
      .update(placements)
      .set({ insertionTorqueNcm: 35, stabilityIsq: 72, grafting: 'Xenograft, buccal', notes: 'Flapless' })
      .where(eq(placements.siteId, siteIds[36]))
      .returning();
    const amended = await post(`/api/placements/${first.id}/amendments`, {
      platformId: first.platformId,
      placedOn: first.placedOn,
      lengthMm: 11.5,
      amendmentReason: 'Length re-read from the box',
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({
      lengthMm: 11.5,
      insertionTorqueNcm: 35,
      stabilityIsq: 72,
      grafting: 'Xenograft, buccal',
      notes: 'Flapless',
      axis: { x: 0.1, y: 0, z: 1 },
      supersedesId: first.id,
    });
  });

  it('keeps what a plan amendment leaves out: shade, laboratory, due date, notes', async () => {
    const tex = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-AMK4', 'Tessely EX 4.1', [
      { fdi: 15, axis: [0, 0, 1] },
      { fdi: 16, axis: [0, 0, 1] },
    ]);
    const plan = {
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      copingsSplinted: true,
      sites: [siteIds[15], siteIds[16]].map((siteId) => ({
        siteId,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
        screwComponentIds: [tex('PSI')],
        impressionCopingComponentId: tex('ICN-O'),
      })),
    };
    const first = await post('/api/restorations', {
      ...plan,
      patientId,
      shade: 'A3',
      labName: 'Ferncliff Dental Lab',
      labEmail: 'lab@ferncliff.example',
      dueOn: '2027-01-15',
      notes: 'Gingival shade on request',
    });
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const amended = await post(`/api/restorations/${first.body.id}/amendments`, {
      ...plan,
      material: 'titanium-porcelain',
      amendmentReason: 'Material changed at try-in',
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({
      material: 'titanium-porcelain',
      shade: 'A3',
      labName: 'Ferncliff Dental Lab',
      labEmail: 'lab@ferncliff.example',
      dueOn: '2027-01-15',
      notes: 'Gingival shade on request',
      copingsSplinted: true,
    });
  });

  it('keeps what an exam amendment leaves out: indices, mucosa, cement, bone level, notes', async () => {
    const { patientId, siteId } = await patientWithPart(ctx, 'T-AMK5', 'Solvra CN 4.3', 'PSI', 46);
    const probes = (depth: number) =>
      POSITIONS.map((position) => ({ position, probingDepthMm: depth, bleeding: false, suppuration: false }));
    const hygienist = await signIn(ctx, 'hygienist');
    const asHygienist = (path: string, body: object) => ctx.http.post(path).set('Cookie', hygienist).send(body);
    const visit = await asHygienist('/api/recalls/visits', {
      patientId,
      examinedOn: '2026-11-10',
      exams: [
        {
          siteId,
          sites: probes(3),
          mobility: false,
          plaqueIndex: 1,
          bleedingIndex: 2,
          keratinizedMucosaMm: 2.5,
          residualCement: true,
          boneLevelMm: 1.5,
          notes: 'Cement found distally',
        },
      ],
    });
    expect(visit.status, JSON.stringify(visit.body)).toBe(201);
    const exam = visit.body.exams[0];
    const amended = await asHygienist(`/api/recalls/exams/${exam.id}/amend`, {
      sites: probes(4),
      mobility: false,
      amendmentReason: 'Probe misread',
    });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body).toMatchObject({
      plaqueIndex: 1,
      bleedingIndex: 2,
      keratinizedMucosaMm: 2.5,
      residualCement: true,
      boneLevelMm: 1.5,
      notes: 'Cement found distally',
    });
    expect(amended.body.sites.map((s: { probingDepthMm: number }) => s.probingDepthMm)).toEqual([4, 4, 4, 4, 4, 4]);
  });
});
