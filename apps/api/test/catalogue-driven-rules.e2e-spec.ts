// The plan's rules read the practice's catalogue, not lists or names in the code (issue 16, item 5):
// the multi-unit angle the catalogue states is the one the divergence check credits, and a chosen part
// whose entry lacks a value a rule reads is a Finding (docs/clinical-rules.md §8c). Divergence limit:
// Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015 [pub]; which value each rule reads
// and the severity of a missing one: decisions [common practice].
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parts, patientWithImplants, testPlatform, type TestPlatform } from './support/ledger-fixtures.js';
import { startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let admin: string;
let dentist: string;
let practiceId: string;
let newPart: TestPlatform['newPart'];
beforeAll(async () => {
  ctx = await startTestApp();
  ({ admin, dentist, practiceId, newPart } = await testPlatform(ctx, 'CV'));
});
afterAll(() => ctx.close());

const plan = (body: object) => ctx.http.post('/api/restorations').set('Cookie', dentist).send(body);
const tilt = (deg: number): [number, number, number] => [
  Math.sin((deg * Math.PI) / 180),
  0,
  Math.cos((deg * Math.PI) / 180),
];

/** A bridge on two multi-units at 33 and 43, implants 40° apart. */
async function muaBridge(chart: string, muaId: string, over: object = {}) {
  const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Solvra CN 4.3', [
    { fdi: 33, axis: [0, 0, 1] },
    { fdi: 43, axis: tilt(40) },
  ]);
  const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
  const site = (fdi: number) => ({
    siteId: siteIds[fdi],
    interface: 'non-engaging',
    impressionCoping: 'multi-unit',
    multiUnitComponentId: muaId,
    screwComponentIds: [part('PSM')],
    impressionCopingComponentId: part('ICM-O'),
    ...over,
  });
  return {
    patientId,
    kind: 'splinted-bridge',
    retention: 'screw-to-multi-unit',
    material: 'titanium-porcelain',
    sites: [site(33), site(43)],
  };
}

describe('multi-unit angle from the catalogue', () => {
  it('credits an angle outside the old 0/17/30 list: 40° − (22.5° + 22.5°) leaves nothing over 15°', async () => {
    const mua = await newPart('multi-unit-abutment', { angleDeg: 22.5, collarHeightMm: 3, engaging: false });
    const res = await plan(await muaBridge('T-CV1', mua.id));
    expect(res.status).toBe(201);
    expect(res.body.findings).toEqual([]);
    expect(res.body.sites.map((s: { multiUnitAngleDeg: number }) => s.multiUnitAngleDeg)).toEqual([22.5, 22.5]);
  });

  it('a multi-unit whose entry states no angle: a warning per site to acknowledge, judged straight', async () => {
    const mua = await newPart('multi-unit-abutment', { angleDeg: null, engaging: false });
    const body = await muaBridge('T-CV2', mua.id);
    const unacknowledged = await plan(body);
    expect(unacknowledged.status).toBe(400);
    expect(unacknowledged.body.fields['sites.0.multiUnitComponentId']).toBe(
      `Acknowledge this warning to save: Site 33: the catalogue does not state the angle of ${mua.name}. The divergence check treats it as straight (0°), which can add a warning but never hide one; enter the angle in the catalogue.`,
    );
    const ok = await plan({
      ...body,
      acknowledgements: [
        { code: 'divergence-over-limit', fdi: null },
        { code: 'catalogue-multi-unit-angle-missing', fdi: 33 },
        { code: 'catalogue-multi-unit-angle-missing', fdi: 43 },
      ],
    });
    expect(ok.status).toBe(201);
    // 40° with no correction credited (Jang 2011: over 15°).
    expect(ok.body.findings.map((f: { code: string; fdi?: number }) => [f.code, f.fdi ?? null])).toEqual([
      ['divergence-over-limit', null],
      ['catalogue-multi-unit-angle-missing', 33],
      ['catalogue-multi-unit-angle-missing', 43],
    ]);
    expect(ok.body.sites.map((s: { multiUnitAngleDeg: number | null }) => s.multiUnitAngleDeg)).toEqual([null, null]);
  });

  it('an angle entered for a multi-unit whose entry states none cannot be saved: it could hide a divergence', async () => {
    const mua = await newPart('multi-unit-abutment', { angleDeg: null, engaging: false });
    const res = await plan(await muaBridge('T-CV3', mua.id, { multiUnitAngleDeg: 30 }));
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.multiUnitComponentId']).toMatch(
      /catalogue does not state the angle of .*the 30° correction entered for it cannot be checked/,
    );
  });

  it('the administrator states the angle (validated beside the field); the plan then reads the new version', async () => {
    const mua = await newPart('multi-unit-abutment', { angleDeg: null, engaging: false });
    const edit = (body: object) =>
      ctx.http.patch(`/api/catalogue/components/${mua.id}`).set('Cookie', admin).send(body);
    const tooWide = await edit({ angleDeg: 50, collarHeightMm: 12 });
    expect(tooWide.status).toBe(400);
    expect(tooWide.body.fields).toEqual({
      angleDeg: 'From 0° (straight) to 45°',
      collarHeightMm: 'From 0 to 10 mm',
    });
    const stated = await edit({ angleDeg: 25, collarHeightMm: 2.5 });
    expect(stated.status).toBe(200);
    expect(stated.body).toMatchObject({ angleDeg: 25, collarHeightMm: 2.5, version: 2 });
    // The plan names the first version's id; the current version (25°) is read: 40 − 50 → 0° left.
    const res = await plan(await muaBridge('T-CV4', mua.id));
    expect(res.status).toBe(201);
    expect(res.body.findings).toEqual([]);
    expect(res.body.sites.map((s: { multiUnitAngleDeg: number }) => s.multiUnitAngleDeg)).toEqual([25, 25]);
  });
});

describe('abutment and impression coping values from the catalogue', () => {
  async function singleCrown(chart: string, over: object) {
    const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Solvra CN 4.3', [{ fdi: 36 }]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    return {
      patientId,
      kind: 'single-crown',
      retention: 'screw-to-implant',
      material: 'zirconia',
      sites: [
        {
          siteId: siteIds[36],
          interface: 'engaging',
          impressionCoping: 'engaging',
          screwComponentIds: [part('PSI')],
          impressionCopingComponentId: part('ICE-C'),
          ...over,
        },
      ],
    };
  }

  it('a coping not stated engaging or not, for a crown indexed to the hex: an error beside the coping', async () => {
    const coping = await newPart('impression-coping', { engaging: null, tray: 'closed', requiresLot: false });
    const res = await plan(await singleCrown('T-CV5', { impressionCopingComponentId: coping.id }));
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.impressionCopingComponentId']).toMatch(
      new RegExp(`does not state whether ${coping.name} is engaging`),
    );
  });

  it('an angled abutment whose entry states no angle: a warning to acknowledge; a stated one passes', async () => {
    const unstated = await newPart('abutment-angled', { angleDeg: null, engaging: true, collarHeightMm: 2 });
    const body = await singleCrown('T-CV6', { abutmentComponentId: unstated.id });
    const cemented = { ...body, retention: 'cement-on-abutment' };
    const res = await plan(cemented);
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.abutmentComponentId']).toMatch(/does not state the angle of/);
    const ok = await plan({
      ...cemented,
      acknowledgements: [{ code: 'catalogue-abutment-angle-missing', fdi: 36 }],
    });
    expect(ok.status).toBe(201);
    const stated = await newPart('abutment-angled', { angleDeg: 15, engaging: true, collarHeightMm: 2 });
    const other = await singleCrown('T-CV7', { abutmentComponentId: stated.id });
    const clean = await plan({ ...other, retention: 'cement-on-abutment' });
    expect(clean.status).toBe(201);
    expect(clean.body.findings).toEqual([]);
  });
});
