// The catalogue states what the rules need per kind of part (issue 16, item 5), and the planner and
// the impression read it: the coping level of impression copings and scan bodies (a restoration
// screwed to multi-unit abutments is recorded at multi-unit level [common practice]) and whether an
// abutment is engaging (a single unit needs an anti-rotational abutment [common practice], the
// reasoning of the `non-engaging-single-crown` rule, docs/clinical-rules.md §8). Severities: §8c.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parts, patientWithImplants, testPlatform, type TestPlatform } from './support/ledger-fixtures.js';
import { startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let admin: string;
let dentist: string;
let platform: string;
let practiceId: string;
let addPart: TestPlatform['addPart'];
let newPart: TestPlatform['newPart'];
beforeAll(async () => {
  ctx = await startTestApp();
  ({ admin, dentist, practiceId, platform, addPart, newPart } = await testPlatform(ctx, 'FT'));
});
afterAll(() => ctx.close());

const plan = (body: object) => ctx.http.post('/api/restorations').set('Cookie', dentist).send(body);

describe('adding a part states the values its kind needs', () => {
  it('each new value is saved and read back: divergence tolerance, retention, coping level, angle and collar', async () => {
    const cases: [string, object][] = [
      ['attachment-abutment', { maxDivergenceDeg: 20, collarHeightMm: 3, angleDeg: 0, engaging: false }],
      ['retentive-insert', { retentionLabel: 'medium', retentionN: 12.5 }],
      ['bar-clip', { retentionLabel: 'light', retentionN: null }],
      ['impression-coping', { copingLevel: 'multi-unit', engaging: false, tray: 'open' }],
      ['scan-body', { copingLevel: 'implant', engaging: true }],
      ['multi-unit-abutment', { angleDeg: 17, collarHeightMm: 2.5, engaging: true }],
      ['abutment-stock', { angleDeg: 0, collarHeightMm: 1.5, engaging: true }],
    ];
    for (const [kind, values] of cases) {
      const res = await addPart(kind, values);
      expect(res.status, kind).toBe(201);
      expect(res.body, kind).toMatchObject({ kind, ...values });
      const catalogue = await ctx.http.get('/api/catalogue').set('Cookie', dentist);
      const listed = catalogue.body.systems
        .flatMap((s: { platforms: { components: { id: string }[] }[] }) => s.platforms)
        .flatMap((p: { components: { id: string }[] }) => p.components)
        .find((c: { id: string }) => c.id === res.body.id);
      expect(listed, kind).toMatchObject(values);
    }
  });

  it('refuses bad values with 400 beside the field, in plain words', async () => {
    const cases: [string, object, string, RegExp][] = [
      ['attachment-abutment', { maxDivergenceDeg: 120 }, 'maxDivergenceDeg', /At most 90°/],
      ['attachment-abutment', { maxDivergenceDeg: -1 }, 'maxDivergenceDeg', /Cannot be negative/],
      ['attachment-abutment', { maxDivergenceDeg: 'steep' }, 'maxDivergenceDeg', /Enter the tolerance in degrees/],
      ['retentive-insert', { retentionN: 500 }, 'retentionN', /At most 100 N/],
      ['retentive-insert', { retentionN: 'firm' }, 'retentionN', /Enter the force in newtons/],
      ['scan-body', { copingLevel: 'abutment' }, 'copingLevel', /Choose implant level or multi-unit/],
      ['multi-unit-abutment', { angleDeg: 60 }, 'angleDeg', /From 0° \(straight\) to 45°/],
      ['abutment-stock', { collarHeightMm: 12 }, 'collarHeightMm', /From 0 to 10 mm/],
      // A value the kind does not state is refused rather than stored where no rule reads it.
      ['abutment-screw', { maxDivergenceDeg: 20 }, 'maxDivergenceDeg', /Only an attachment abutment/],
      ['abutment-stock', { copingLevel: 'implant' }, 'copingLevel', /Only an impression coping or a scan body/],
      ['scan-body', { retentionLabel: 'strong' }, 'retentionLabel', /Only a retentive insert or a bar clip/],
    ];
    for (const [kind, values, field, message] of cases) {
      const res = await addPart(kind, values);
      expect(res.status, `${kind} ${field}`).toBe(400);
      expect(res.body.fields[field], `${kind} ${field}`).toMatch(message);
    }
  });

  it('an edit may state the coping level, and refuses one on a kind without it', async () => {
    const coping = await newPart('impression-coping', { engaging: false, copingLevel: null });
    const edit = (id: string, body: object) =>
      ctx.http.patch(`/api/catalogue/components/${id}`).set('Cookie', admin).send(body);
    const stated = await edit(coping.id, { copingLevel: 'implant' });
    expect(stated.status).toBe(200);
    expect(stated.body).toMatchObject({ copingLevel: 'implant', version: 2 });
    const screw = await newPart('abutment-screw', {});
    const refused = await edit(screw.id, { copingLevel: 'implant' });
    expect(refused.status).toBe(400);
    expect(refused.body.fields.copingLevel).toMatch(/Only an impression coping or a scan body/);
  });
});

describe('coping level: the impression records the level the restoration is made on [common practice]', () => {
  async function muaBridge(chart: string, copingId: string) {
    const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Solvra CN 4.3', [
      { fdi: 33, axis: [0, 0, 1] },
      { fdi: 43, axis: [0, 0, 1] },
    ]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const site = (fdi: number) => ({
      siteId: siteIds[fdi],
      interface: 'non-engaging',
      impressionCoping: 'multi-unit',
      multiUnitComponentId: part('MU0-2'),
      screwComponentIds: [part('PSM')],
      impressionCopingComponentId: copingId,
    });
    return {
      patientId,
      siteIds,
      body: {
        patientId,
        kind: 'splinted-bridge',
        retention: 'screw-to-multi-unit',
        material: 'titanium-porcelain',
        sites: [site(33), site(43)],
      },
    };
  }

  it('a bridge on multi-units with an implant-level coping: 400 beside the coping; the multi-unit coping passes', async () => {
    const implantLevel = await newPart('impression-coping', { engaging: false, copingLevel: 'implant', tray: 'open' });
    const wrong = await plan((await muaBridge('T-FT1', implantLevel.id)).body);
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields['sites.0.impressionCopingComponentId']).toMatch(
      /works at implant level, but this restoration is screwed to multi-unit abutments/,
    );
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const right = await plan((await muaBridge('T-FT2', part('ICM-O'))).body);
    expect(right.status, JSON.stringify(right.body)).toBe(201);
    expect(right.body.findings).toEqual([]);
  });

  it('a coping whose level is not stated: a warning per site to acknowledge (catalogue-coping-level-missing)', async () => {
    const unstated = await newPart('impression-coping', { engaging: false, copingLevel: null, tray: 'open' });
    const { body } = await muaBridge('T-FT3', unstated.id);
    const first = await plan(body);
    expect(first.status).toBe(400);
    expect(first.body.fields['sites.0.impressionCopingComponentId']).toMatch(
      /^Acknowledge this warning to save: Site 33: the catalogue does not state whether .* works at implant level or on a multi-unit abutment/,
    );
    const ok = await plan({
      ...body,
      acknowledgements: [33, 43].map((fdi) => ({ code: 'catalogue-coping-level-missing', fdi })),
    });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.findings.map((f: { code: string }) => f.code)).toEqual([
      'catalogue-coping-level-missing',
      'catalogue-coping-level-missing',
    ]);
  });

  it('a digital impression of a bridge on multi-units needs multi-unit scan bodies; an unstated level is a warning', async () => {
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const { body, siteIds } = await muaBridge('T-FT4', part('ICM-O'));
    const planned = await plan(body);
    expect(planned.status).toBe(201);
    const take = (scanBody: string) =>
      ctx.http
        .post(`/api/restorations/${planned.body.id}/impressions`)
        .set('Cookie', dentist)
        .send({
          method: 'digital',
          takenOn: '2026-11-20',
          scanBodies: [33, 43].map((fdi) => ({ siteId: siteIds[fdi], componentId: scanBody, lot: `L${fdi}` })),
        });
    const implantLevel = await take(part('SB'));
    expect(implantLevel.status).toBe(400);
    expect(implantLevel.body.fields['scanBodies.0.componentId']).toMatch(
      /works at implant level, but this restoration is screwed to multi-unit abutments: the impression must record the abutment with a multi-unit level scan body/,
    );
    const unstated = await newPart('scan-body', { engaging: false, copingLevel: null });
    const taken = await take(unstated.id);
    expect(taken.status, JSON.stringify(taken.body)).toBe(201);
    const listed = await ctx.http.get(`/api/restorations/${planned.body.id}/impressions`).set('Cookie', dentist);
    expect(listed.body.findings.map((f: { code: string; fdi: number }) => [f.code, f.fdi])).toEqual([
      ['catalogue-coping-level-missing', 33],
      ['catalogue-coping-level-missing', 43],
    ]);
    // Once the catalogue states it, the warning is gone (the current version of the part is read).
    const edited = await ctx.http
      .patch(`/api/catalogue/components/${unstated.id}`)
      .set('Cookie', admin)
      .send({ copingLevel: 'multi-unit' });
    expect(edited.status).toBe(200);
    const again = await ctx.http.get(`/api/restorations/${planned.body.id}/impressions`).set('Cookie', dentist);
    expect(again.body.findings).toEqual([]);
  });
});

describe("the demo catalogue's multi-unit scan body (SBM) on digital impressions [common practice]", () => {
  // Worked cases with the seeded parts of Solvra CN 4.3: the multi-unit scan body records a
  // multi-unit abutment, the plain one (SB) the implant; each is refused where the other belongs.
  const take = (restorationId: string, siteIds: Record<number, string>, fdis: number[], scanBody: string) =>
    ctx.http
      .post(`/api/restorations/${restorationId}/impressions`)
      .set('Cookie', dentist)
      .send({
        method: 'digital',
        takenOn: '2026-11-20',
        scanBodies: fdis.map((fdi) => ({ siteId: siteIds[fdi], componentId: scanBody, lot: `MU-${fdi}` })),
      });

  it('is in the catalogue at multi-unit level, of the platform, with its lot asked for', async () => {
    const catalogue = await ctx.http.get('/api/catalogue').set('Cookie', dentist);
    const scn43 = catalogue.body.systems
      .flatMap((s: { platforms: { name: string; components: unknown[] }[] }) => s.platforms)
      .find((p: { name: string }) => p.name === 'Solvra CN 4.3');
    expect(scn43.components).toContainEqual(
      expect.objectContaining({
        kind: 'scan-body',
        referenceCode: 'SCN-43-SBM',
        copingLevel: 'multi-unit',
        requiresLot: true,
        platformId: platform,
      }),
    );
  });

  it('a bridge screwed to multi-units at 34 and 44: SBM passes, SB is refused naming the site', async () => {
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-SBM1', 'Solvra CN 4.3', [
      { fdi: 34, axis: [0, 0, 1] },
      { fdi: 44, axis: [0, 0, 1] },
    ]);
    const site = (fdi: number) => ({
      siteId: siteIds[fdi],
      interface: 'non-engaging',
      impressionCoping: 'multi-unit',
      multiUnitComponentId: part('MU0-2'),
      screwComponentIds: [part('PSM')],
      impressionCopingComponentId: part('ICM-O'),
    });
    const planned = await plan({
      patientId,
      kind: 'splinted-bridge',
      retention: 'screw-to-multi-unit',
      material: 'titanium-porcelain',
      sites: [site(34), site(44)],
    });
    expect(planned.status, JSON.stringify(planned.body)).toBe(201);
    const wrong = await take(planned.body.id, siteIds, [34, 44], part('SB'));
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields['scanBodies.0.componentId']).toBe(
      'Site 34: Scan body, hand-tight works at implant level, but this restoration is screwed to multi-unit abutments: the impression must record the abutment with a multi-unit level scan body.',
    );
    expect(wrong.body.fields['scanBodies.1.componentId']).toMatch(/^Site 44: /);
    const right = await take(planned.body.id, siteIds, [34, 44], part('SBM'));
    expect(right.status, JSON.stringify(right.body)).toBe(201);
    expect(right.body.scanBodies.map((b: { fdi: number; referenceCode: string }) => [b.fdi, b.referenceCode])).toEqual([
      [34, 'SCN-43-SBM'],
      [44, 'SCN-43-SBM'],
    ]);
    const listed = await ctx.http.get(`/api/restorations/${planned.body.id}/impressions`).set('Cookie', dentist);
    expect(listed.body.findings).toEqual([]);
  });

  it('a crown screwed to the implant at 36: SBM is refused naming the site, SB passes', async () => {
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-SBM2', 'Solvra CN 4.3', [{ fdi: 36 }]);
    const planned = await plan({
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
        },
      ],
    });
    expect(planned.status, JSON.stringify(planned.body)).toBe(201);
    const wrong = await take(planned.body.id, siteIds, [36], part('SBM'));
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields['scanBodies.0.componentId']).toBe(
      'Site 36: Multi-unit scan body, hand-tight works on a multi-unit abutment, but this restoration has none: use an implant-level scan body.',
    );
    const right = await take(planned.body.id, siteIds, [36], part('SB'));
    expect(right.status, JSON.stringify(right.body)).toBe(201);
  });
});

describe('engaging: the abutment under a single crown must be anti-rotational [common practice]', () => {
  async function cementedCrown(chart: string, abutmentId: string, connection = 'engaging') {
    const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Solvra CN 4.3', [{ fdi: 46 }]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    return {
      patientId,
      kind: 'single-crown',
      retention: 'cement-on-abutment',
      material: 'zirconia',
      sites: [
        {
          siteId: siteIds[46],
          interface: connection,
          impressionCoping: 'engaging',
          abutmentComponentId: abutmentId,
          screwComponentIds: [part('AS')],
          impressionCopingComponentId: part('ICE-C'),
        },
      ],
    };
  }

  it('a non-engaging abutment under a single crown: 400 beside the abutment, in plain words', async () => {
    const nonEngaging = await newPart('abutment-stock', { engaging: false, angleDeg: 0, collarHeightMm: 2 });
    const res = await plan(await cementedCrown('T-FT5', nonEngaging.id));
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.abutmentComponentId']).toBe(
      `Site 46: ${nonEngaging.name} is non-engaging. A single crown needs an engaging (anti-rotational) abutment: on a non-engaging one the crown and abutment can turn and the screw loosen.`,
    );
  });

  it('an abutment whose entry does not say: 400 for a single crown; an engaging one passes', async () => {
    const unstated = await newPart('abutment-custom', { engaging: null });
    const res = await plan(await cementedCrown('T-FT6', unstated.id));
    expect(res.status).toBe(400);
    expect(res.body.fields['sites.0.abutmentComponentId']).toMatch(/does not state whether .* is engaging/);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const ok = await plan(await cementedCrown('T-FT7', part('CA')));
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.findings).toEqual([]);
  });
});
