// The four restoration pathways of the product brief, each planned (with its error cases),
// delivered and shown in the Stack. Plan rules are those of validateRestorationPlan
// (docs/clinical-rules.md §8); torque specs are the demo catalogue's [common practice] values.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { larkspurId, parts, patientWithImplants } from './support/ledger-fixtures.js';
import { signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let practiceId: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  practiceId = await larkspurId(ctx.db);
});
afterAll(() => ctx.close());

const plan = (body: object) => ctx.http.post('/api/restorations').set('Cookie', dentist).send(body);
const deliver = (id: string, body: object) =>
  ctx.http.post(`/api/restorations/${id}/delivery`).set('Cookie', dentist).send(body);
const stack = async (siteId: string) => (await ctx.http.get(`/api/sites/${siteId}`).set('Cookie', dentist)).body;

describe('1. screw-retained directly on the implants (splinted bridge, non-engaging)', () => {
  it('refuses an engaging coping and an engaging interface, saves the fixed plan, delivers, shows the Stack', async () => {
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-P1', 'Solvra CN 4.3', [
      { fdi: 44, axis: [0, 0, 1] },
      { fdi: 46, axis: [0.1, 0, 1] },
    ]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const site = (fdi: number, over: object = {}) => ({
      siteId: siteIds[fdi],
      interface: 'non-engaging',
      impressionCoping: 'non-engaging',
      restorativeSpaceMm: 7,
      screwComponentIds: [part('PSI')],
      impressionCopingComponentId: part('ICN-O'),
      ...over,
    });
    const body = {
      patientId,
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      shade: 'A2',
      copingsSplinted: true,
      sites: [site(44), site(46)],
    };

    // Engaging coping on a splinted bridge screwed to the implants: error (common practice).
    const bad = await plan({
      ...body,
      sites: [site(44, { impressionCoping: 'engaging', impressionCopingComponentId: part('ICE-C') }), site(46)],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.fields['sites.0.impressionCoping']).toMatch(/non-engaging/i);
    // Engaging interface: a framework cannot seat on several hexes (common practice).
    const bad2 = await plan({ ...body, sites: [site(44), site(46, { interface: 'engaging' })] });
    expect(bad2.status).toBe(400);
    expect(bad2.body.fields).toHaveProperty('sites.1.interface');
    // Restorative space below 5 mm for screw-retained at implant level (Carpentieri 2019).
    const bad3 = await plan({ ...body, sites: [site(44, { restorativeSpaceMm: 4 }), site(46)] });
    expect(bad3.status).toBe(400);
    expect(bad3.body.fields).toHaveProperty('sites.0.restorativeSpaceMm');

    const ok = await plan(body);
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({
      status: 'planned',
      findings: [],
      rulesVersion: expect.any(String),
      retrievable: true,
    });
    expect(ok.body.sites.map((s: { fdi: number; universal: string }) => [s.fdi, s.universal])).toEqual([
      [44, '28'],
      [46, '30'],
    ]);

    const delivered = await deliver(ok.body.id, {
      deliveredOn: '2026-11-20',
      impressionTakenOn: '2026-11-01',
      parts: [44, 46].map((fdi) => ({ siteId: siteIds[fdi], componentId: part('PSI'), lot: `PSI-${fdi}` })),
    });
    expect(delivered.status).toBe(200);
    expect(delivered.body).toMatchObject({
      status: 'delivered',
      deliveredOn: '2026-11-20',
      impressionTakenOn: '2026-11-01',
    });
    const file = await stack(siteIds[44]);
    expect(file.status).toBe('restored');
    expect(file.restoration).toMatchObject({
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      interface: 'non-engaging',
      retrievable: true,
      spansFdi: [44, 46],
    });
    expect(file.parts).toEqual([
      expect.objectContaining({
        kind: 'prosthetic-screw',
        torqueSpecNcm: 25,
        lot: 'PSI-44',
        lastTorque: null,
        retorqueDueAt: null,
      }),
    ]);
  });
});

describe('2. screw-retained on multi-unit abutments (straight and 17°)', () => {
  it('needs multi-unit copings, warns on divergence left after the angle correction, delivers', async () => {
    // 40° apart: with a 17° multi-unit on one site 23° remain, more than 15° (Jang 2011) → warning.
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-P2', 'Solvra CN 4.3', [
      { fdi: 33, axis: [0, 0, 1] },
      { fdi: 43, axis: [Math.sin((40 * Math.PI) / 180), 0, Math.cos((40 * Math.PI) / 180)] },
    ]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const site = (fdi: number, mua: string, over: object = {}) => ({
      siteId: siteIds[fdi],
      interface: 'non-engaging',
      impressionCoping: 'multi-unit',
      restorativeSpaceMm: 9,
      multiUnitComponentId: part(mua),
      screwComponentIds: [part('PSM')],
      impressionCopingComponentId: part('ICM-O'),
      ...over,
    });
    const body = {
      patientId,
      kind: 'splinted-bridge',
      retention: 'screw-to-multi-unit',
      material: 'titanium-porcelain',
      sites: [site(33, 'MU0-2'), site(43, 'MU17-25')],
    };

    const noMuaCoping = await plan({
      ...body,
      sites: [
        site(33, 'MU0-2', { impressionCoping: 'non-engaging', impressionCopingComponentId: part('ICN-O') }),
        site(43, 'MU17-25'),
      ],
    });
    expect(noMuaCoping.status).toBe(400);
    expect(noMuaCoping.body.fields).toHaveProperty('sites.0.impressionCoping');

    const unacknowledged = await plan(body);
    expect(unacknowledged.status).toBe(400);
    expect(unacknowledged.body.fields['sites']).toMatch(/Acknowledge/);

    const ok = await plan({ ...body, acknowledgements: [{ code: 'divergence-over-limit', fdi: null }] });
    expect(ok.status).toBe(201);
    expect(ok.body.findings).toEqual([expect.objectContaining({ severity: 'warning', code: 'divergence-over-limit' })]);
    expect(ok.body.acknowledgements).toEqual([
      expect.objectContaining({ code: 'divergence-over-limit', byName: 'Dr Ines Calloway' }),
    ]);
    // The angle comes from the multi-unit chosen.
    expect(ok.body.sites.map((s: { multiUnitAngleDeg: number }) => s.multiUnitAngleDeg)).toEqual([0, 17]);

    const delivered = await deliver(ok.body.id, {
      deliveredOn: '2026-11-21',
      parts: [
        { siteId: siteIds[33], componentId: part('MU0-2'), lot: 'MU0-A' },
        { siteId: siteIds[33], componentId: part('PSM'), lot: 'PSM-A' },
        { siteId: siteIds[43], componentId: part('MU17-25'), lot: 'MU17-A' },
        { siteId: siteIds[43], componentId: part('PSM'), lot: 'PSM-B' },
      ],
    });
    expect(delivered.status).toBe(200);
    const file = await stack(siteIds[43]);
    // Angled multi-unit about 15 N·cm, prosthetic screw on a multi-unit about 15 N·cm [common practice].
    expect(file.parts.map((p: { kind: string; torqueSpecNcm: number }) => [p.kind, p.torqueSpecNcm])).toEqual([
      ['multi-unit-abutment', 15],
      ['prosthetic-screw', 15],
    ]);
    expect((await stack(siteIds[33])).parts[0]).toMatchObject({
      kind: 'multi-unit-abutment',
      angleDeg: 0,
      torqueSpecNcm: 35,
    });
  });
});

describe('3. cement-retained on an engaging abutment (single crown)', () => {
  it('needs an engaging impression and interface, refuses a part of another platform and a missing lot, flags not retrievable', async () => {
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-P3', 'Miravik HX 4.8', [{ fdi: 36 }]);
    const part = await parts(ctx.db, practiceId, 'Miravik HX 4.8');
    const other = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const site = (over: object = {}) => ({
      siteId: siteIds[36],
      interface: 'engaging',
      impressionCoping: 'engaging',
      restorativeSpaceMm: 8,
      abutmentComponentId: part('CA'),
      screwComponentIds: [part('AS')],
      impressionCopingComponentId: part('ICE-C'),
      ...over,
    });
    const body = {
      patientId,
      kind: 'single-crown',
      retention: 'cement-on-abutment',
      material: 'porcelain-fused-to-metal',
      shade: 'A3',
      sites: [site()],
    };

    const wrongPlatform = await plan({ ...body, sites: [site({ abutmentComponentId: other('CA') })] });
    expect(wrongPlatform.status).toBe(400);
    expect(wrongPlatform.body.fields['sites.0.abutmentComponentId']).toMatch(/does not fit/);
    const wrongKind = await plan({ ...body, sites: [site({ abutmentComponentId: part('AS') })] });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.fields).toHaveProperty('sites.0.abutmentComponentId');
    const nonEngaging = await plan({
      ...body,
      sites: [site({ impressionCoping: 'non-engaging', impressionCopingComponentId: part('ICN-O') })],
    });
    expect(nonEngaging.status).toBe(400);
    expect(nonEngaging.body.fields).toHaveProperty('sites.0.impressionCoping');
    const singleNonEngaging = await plan({ ...body, sites: [site({ interface: 'non-engaging' })] });
    expect(singleNonEngaging.body.fields).toHaveProperty('sites.0.interface');
    // Cement-retained needs 7–8 mm (Carpentieri 2019): 7.5 mm is short of the strict end, 8 mm.
    const short = await plan({ ...body, sites: [site({ restorativeSpaceMm: 7.5 })] });
    expect(short.body.fields).toHaveProperty('sites.0.restorativeSpaceMm');

    const ok = await plan(body);
    expect(ok.status).toBe(201);
    expect(ok.body.retrievable).toBe(false);

    const noLot = await deliver(ok.body.id, {
      deliveredOn: '2026-11-22',
      parts: [
        { siteId: siteIds[36], componentId: part('CA'), lot: 'CA-1' },
        { siteId: siteIds[36], componentId: part('AS') },
      ],
    });
    expect(noLot.status).toBe(400);
    expect(noLot.body.fields['parts.1.lot']).toMatch(/lot number/);
    const foreign = await deliver(ok.body.id, {
      deliveredOn: '2026-11-22',
      parts: [{ siteId: siteIds[36], componentId: other('CA'), lot: 'X' }],
    });
    expect(foreign.body.fields).toHaveProperty('parts.0.componentId');
    // Nothing half-saved: the failed deliveries left no parts and the plan still planned.
    expect((await stack(siteIds[36])).parts).toEqual([]);
    expect((await ctx.http.get(`/api/restorations/${ok.body.id}`).set('Cookie', dentist)).body.status).toBe('planned');

    const delivered = await deliver(ok.body.id, {
      deliveredOn: '2026-11-22',
      parts: [
        { siteId: siteIds[36], componentId: part('CA'), lot: 'CA-1' },
        { siteId: siteIds[36], componentId: part('AS'), lot: 'AS-1' },
      ],
    });
    expect(delivered.status).toBe(200);
    const file = await stack(siteIds[36]);
    expect(file.restoration).toMatchObject({ retention: 'cement-on-abutment', retrievable: false });
    expect(file.parts.map((p: { kind: string }) => p.kind)).toEqual(['abutment-custom', 'abutment-screw']);
    const again = await deliver(ok.body.id, {
      deliveredOn: '2026-11-22',
      parts: [{ siteId: siteIds[36], componentId: part('AS'), lot: 'AS-2' }],
    });
    expect(again.status).toBe(409);
  });
});

describe('4. lingual set-screw retained (single crown on an engaging abutment)', () => {
  it('plans, delivers with the set screw, and the Stack shows it retrievable', async () => {
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-P4', 'Solvra CN 3.5', [{ fdi: 24 }]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 3.5');
    const site = (over: object = {}) => ({
      siteId: siteIds[24],
      interface: 'engaging',
      impressionCoping: 'engaging',
      restorativeSpaceMm: 8,
      abutmentComponentId: part('SA'),
      screwComponentIds: [part('AS'), part('LSS')],
      impressionCopingComponentId: part('ICE-C'),
      ...over,
    });
    const body = {
      patientId,
      kind: 'single-crown',
      retention: 'lingual-set-screw',
      material: 'zirconia',
      shade: 'B1',
      sites: [site()],
    };

    const mismatched = await plan({ ...body, sites: [site({ impressionCoping: 'non-engaging' })] });
    expect(mismatched.status).toBe(400);
    expect(mismatched.body.fields).toHaveProperty('sites.0.impressionCopingComponentId');
    const twoSites = await plan({ ...body, sites: [site(), site()] });
    expect(twoSites.status).toBe(400);

    const ok = await plan(body);
    expect(ok.status).toBe(201);
    expect(ok.body.sites[0].components.map((c: { kind: string }) => c.kind).sort()).toEqual([
      'abutment-screw',
      'abutment-stock',
      'impression-coping',
      'set-screw',
    ]);
    const coping = await deliver(ok.body.id, {
      deliveredOn: '2026-11-23',
      parts: [{ siteId: siteIds[24], componentId: part('ICE-C') }],
    });
    expect(coping.body.fields).toHaveProperty('parts.0.componentId');
    const delivered = await deliver(ok.body.id, {
      deliveredOn: '2026-11-23',
      parts: ['SA', 'AS', 'LSS'].map((s) => ({ siteId: siteIds[24], componentId: part(s), lot: `${s}-1` })),
    });
    expect(delivered.status).toBe(200);
    const file = await stack(siteIds[24]);
    expect(file.restoration).toMatchObject({ retention: 'lingual-set-screw', retrievable: true });
    expect(file.parts.map((p: { kind: string }) => p.kind)).toEqual(['abutment-stock', 'abutment-screw', 'set-screw']);
  });
});

describe('planning on the demo patient Wendell Achterberg (Tessely EX 4.1, healing abutments on)', () => {
  it('uses the placement axes, and delivery takes the healing abutments out', async () => {
    const pid = (await ctx.http.get('/api/patients').query({ search: 'LL-1005' }).set('Cookie', dentist)).body.items[0]
      .id;
    const sites = (await ctx.http.get(`/api/patients/${pid}/restorable-sites`).set('Cookie', dentist)).body.items;
    expect(
      sites.map((s: { fdi: number; platformName: string; connection: string }) => [
        s.fdi,
        s.platformName,
        s.connection,
      ]),
    ).toEqual([
      [15, 'Tessely EX 4.1', 'external-hex'],
      [16, 'Tessely EX 4.1', 'external-hex'],
    ]);
    expect(sites[0].axis).toEqual([0.05, 0, 1]);
    const part = await parts(ctx.db, practiceId, 'Tessely EX 4.1');
    const ok = await plan({
      patientId: pid,
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      copingsSplinted: true,
      sites: sites.map((s: { siteId: string }) => ({
        siteId: s.siteId,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
        screwComponentIds: [part('PSI')],
      })),
    });
    expect(ok.status).toBe(201);
    expect((await stack(sites[0].siteId)).parts.map((p: { kind: string }) => p.kind)).toEqual(['healing-abutment']);
    const delivered = await deliver(ok.body.id, {
      deliveredOn: new Date().toISOString().slice(0, 10),
      parts: sites.map((s: { siteId: string }) => ({ siteId: s.siteId, componentId: part('PSI'), lot: 'PSI-W' })),
    });
    expect(delivered.status).toBe(200);
    expect((await stack(sites[0].siteId)).parts.map((p: { kind: string }) => p.kind)).toEqual(['prosthetic-screw']);
  });
});

// One story on Harold Whitcombe's 35–37 bridge: the first step needs the bridge still in place,
// the second retires it.
describe('the Stack after a new plan on a restored site', () => {
  it('keeps showing the delivered restoration, not the plan; delivering a new crown on 35 then retires the 35–37 bridge: it is removed, its screws come out, its history stays', async () => {
    const pid = (await ctx.http.get('/api/patients').query({ search: 'LL-1001' }).set('Cookie', dentist)).body.items[0]
      .id;
    const [s35, s37] = (await ctx.http.get(`/api/patients/${pid}/restorable-sites`).set('Cookie', dentist)).body.items;
    const res = await plan({
      patientId: pid,
      kind: 'single-crown',
      retention: 'cement-on-abutment',
      material: 'zirconia',
      sites: [{ siteId: s35.siteId, interface: 'engaging', impressionCoping: 'engaging' }],
    });
    expect(res.status).toBe(201);
    expect((await stack(s35.siteId)).restoration).toMatchObject({ kind: 'splinted-bridge', deliveredOn: '2012-09-20' });

    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const crown = await plan({
      patientId: pid,
      kind: 'single-crown',
      retention: 'cement-on-abutment',
      material: 'zirconia',
      sites: [
        {
          siteId: s35.siteId,
          interface: 'engaging',
          impressionCoping: 'engaging',
          abutmentComponentId: part('CA'),
          screwComponentIds: [part('AS')],
        },
      ],
    });
    expect(crown.status).toBe(201);
    const delivered = await deliver(crown.body.id, {
      deliveredOn: '2026-11-25',
      parts: [
        { siteId: s35.siteId, componentId: part('CA'), lot: 'CA-9' },
        { siteId: s35.siteId, componentId: part('AS'), lot: 'AS-9' },
      ],
    });
    expect(delivered.status).toBe(200);
    const at35 = await stack(s35.siteId);
    expect(at35.restoration).toMatchObject({ kind: 'single-crown', retention: 'cement-on-abutment' });
    expect(at35.parts.map((p: { kind: string }) => p.kind)).toEqual(['abutment-custom', 'abutment-screw']);
    const at37 = await stack(s37.siteId);
    expect(at37.restoration).toBeNull();
    expect(at37.parts).toEqual([]);
    const list = (await ctx.http.get(`/api/patients/${pid}/restorations`).set('Cookie', dentist)).body.items;
    expect(list.find((r: { kind: string }) => r.kind === 'splinted-bridge').status).toBe('removed');
    const timeline = (await ctx.http.get(`/api/sites/${s37.siteId}/timeline?kinds=part,torque`).set('Cookie', dentist))
      .body;
    expect(
      timeline.events.filter((e: { title: string }) => e.title.startsWith('Removed: Prosthetic screw')),
    ).toHaveLength(1);
    expect(timeline.events.filter((e: { kind: string }) => e.kind === 'torque').length).toBeGreaterThan(3);
  });
});
