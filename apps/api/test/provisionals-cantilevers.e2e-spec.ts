// Issue 16 items 3 and 6. Provisionals: recorded with their planned replacement day, shown on the
// Site file, listed on the Recall desk once past it (overdue from the day after [decision]), and
// retired — kept, marked replaced — by the definitive restoration delivered on their sites.
// Cantilevers: a distal cantilever over the practice's ratio × the entered A-P spread is a warning
// to acknowledge (default 1.5: English CE 1990 [memory]; [common practice]); the practice sets its
// own ratio. Who may call the settings routes: route-actor-matrix.e2e-spec.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { larkspurId, parts, patientWithImplants } from './support/ledger-fixtures.js';
import { signInAll, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let practiceId: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  practiceId = await larkspurId(ctx.db);
});
afterAll(() => ctx.close());

const send = (who: AccountKey, method: 'post' | 'put', path: string, body: object) =>
  ctx.http[method](path).set('Cookie', cookies[who]).send(body);
const get = (who: AccountKey, path: string, query: object = {}) =>
  ctx.http.get(path).query(query).set('Cookie', cookies[who]);
const day = (daysFromToday: number) => new Date(Date.now() + daysFromToday * 86_400_000).toISOString().slice(0, 10);
const setRatio = (who: AccountKey, cantileverRatioLimit: unknown) =>
  send(who, 'put', '/api/practice/cantilever-settings', { cantileverRatioLimit });

/** A four-implant lower full arch on straight multi-units, valid apart from its cantilevers. */
async function fullArch(chart: string) {
  const fdis = [35, 32, 42, 45];
  const { patientId, siteIds } = await patientWithImplants(
    ctx,
    chart,
    'Solvra CN 4.3',
    fdis.map((fdi) => ({ fdi, axis: [0, 0, 1] as [number, number, number] })),
  );
  const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
  return {
    patientId,
    kind: 'full-arch',
    retention: 'screw-to-multi-unit',
    material: 'titanium-composite',
    sites: fdis.map((fdi) => ({
      siteId: siteIds[fdi],
      interface: 'non-engaging',
      impressionCoping: 'multi-unit',
      restorativeSpaceMm: 16,
      multiUnitComponentId: part('MU0-2'),
      screwComponentIds: [part('PSM')],
      impressionCopingComponentId: part('ICM-O'),
    })),
  };
}

describe('cantilevers against the A-P spread', () => {
  it('passes a cantilever at 1.5 × the spread, warns just over it, and uses the practice ratio', async () => {
    const body = await fullArch('T-CANT1');
    // Spread 10 mm × 1.5 = 15 mm (English 1990 [memory]; [common practice]): 15 mm passes.
    const inside = await send('dentist', 'post', '/api/restorations', {
      ...body,
      apSpreadMm: 10,
      cantileverLeftMm: 15,
      cantileverRightMm: 14.9,
    });
    expect(inside.status, JSON.stringify(inside.body)).toBe(201);
    expect(inside.body).toMatchObject({ findings: [], apSpreadMm: 10, cantileverLeftMm: 15, cantileverRightMm: 14.9 });

    // 15.1 mm on the left is just over: a caution to acknowledge, beside the field.
    const over = { ...body, apSpreadMm: 10, cantileverLeftMm: 15.1, cantileverRightMm: 12 };
    const unacknowledged = await send('dentist', 'post', '/api/restorations', over);
    expect(unacknowledged.status).toBe(400);
    expect(unacknowledged.body.fields.cantileverLeftMm).toMatch(
      /^Acknowledge this warning to save: Caution: the left distal cantilever \(15\.1 mm\) is longer than the practice limit of 1\.5 × the A-P spread of 10 mm \(15 mm\)/,
    );
    const acknowledged = await send('dentist', 'post', '/api/restorations', {
      ...over,
      acknowledgements: [{ code: 'cantilever-left-over-limit', fdi: null }],
    });
    expect(acknowledged.status, JSON.stringify(acknowledged.body)).toBe(201);
    expect(acknowledged.body.findings).toEqual([
      expect.objectContaining({ severity: 'warning', code: 'cantilever-left-over-limit' }),
    ]);
    expect(acknowledged.body.findings[0].message).toMatch(/not a diagnosis/);

    // The practice sets 1.0: the same 12 mm right cantilever on a 10 mm spread is now over (10 mm).
    expect((await setRatio('practice_admin', 1)).status).toBe(200);
    try {
      expect((await get('dentist', '/api/practice/cantilever-settings')).body).toEqual({ cantileverRatioLimit: 1 });
      const strict = await send('dentist', 'post', '/api/restorations', {
        ...body,
        apSpreadMm: 10,
        cantileverRightMm: 12,
      });
      expect(strict.status).toBe(400);
      expect(strict.body.fields.cantileverRightMm).toMatch(/practice limit of 1 × the A-P spread of 10 mm \(10 mm\)/);
    } finally {
      await setRatio('practice_admin', 1.5);
    }
  });

  it('asks for the spread (info) and refuses cantilevers on a kind that does not record them', async () => {
    const body = await fullArch('T-CANT2');
    const noSpread = await send('dentist', 'post', '/api/restorations', { ...body, cantileverLeftMm: 8 });
    expect(noSpread.status, JSON.stringify(noSpread.body)).toBe(201);
    expect(noSpread.body.findings).toEqual([
      expect.objectContaining({ severity: 'info', code: 'cantilever-spread-missing' }),
    ]);
    const bridge = await send('dentist', 'post', '/api/restorations', {
      ...body,
      kind: 'splinted-bridge',
      cantileverRightMm: 8,
    });
    expect(bridge.status).toBe(400);
    expect(bridge.body.fields.cantileverRightMm).toBe(
      'Cantilevers and the A-P spread are recorded for full-arch work only',
    );
    const negative = await send('dentist', 'post', '/api/restorations', { ...body, cantileverLeftMm: -2 });
    expect(negative.status).toBe(400);
    expect(negative.body.fields.cantileverLeftMm).toBe('Cannot be negative');
  });

  it("validates the practice's ratio beside the field", async () => {
    expect((await get('hygienist', '/api/practice/cantilever-settings')).body).toEqual({ cantileverRatioLimit: 1.5 });
    for (const bad of [0.4, 3.1, 1.55]) {
      const res = await setRatio('practice_admin', bad);
      expect(res.status).toBe(400);
      expect(res.body.fields.cantileverRatioLimit).toBe('A ratio from 0.5 to 3, in tenths (e.g. 1.5)');
    }
    expect((await setRatio('practice_admin', 'x')).body.fields.cantileverRatioLimit).toBe('Enter a ratio, e.g. 1.5');
    expect((await setRatio('dentist', 1)).status).toBe(403);
  });
});

describe('provisionals', () => {
  it('records one, lists it on the Recall desk once overdue, and the definitive retires it', async () => {
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-PROV1', 'Solvra CN 3.5', [{ fdi: 21 }]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 3.5');
    const crown = {
      patientId,
      kind: 'single-crown',
      retention: 'screw-to-implant',
      material: 'other',
      sites: [
        {
          siteId: siteIds[21],
          interface: 'engaging',
          impressionCoping: 'engaging',
          screwComponentIds: [part('PSI')],
          impressionCopingComponentId: part('ICE-C'),
        },
      ],
    };
    const deliver = (id: string, deliveredOn: string, lot: string) =>
      send('dentist', 'post', `/api/restorations/${id}/delivery`, {
        deliveredOn,
        parts: [{ siteId: siteIds[21], componentId: part('PSI'), lot }],
      });

    const noDay = await send('dentist', 'post', '/api/restorations', { ...crown, provisional: true });
    expect(noDay.status).toBe(400);
    expect(noDay.body.fields.plannedReplacementOn).toMatch(/Enter the day the definitive restoration is planned/);
    const dayWithout = await send('dentist', 'post', '/api/restorations', {
      ...crown,
      plannedReplacementOn: day(30),
    });
    expect(dayWithout.body.fields.plannedReplacementOn).toBe(
      'Only a provisional restoration has a planned replacement day',
    );

    const provisional = await send('dentist', 'post', '/api/restorations', {
      ...crown,
      provisional: true,
      plannedReplacementOn: day(-1),
    });
    expect(provisional.status, JSON.stringify(provisional.body)).toBe(201);
    expect(provisional.body).toMatchObject({ provisional: true, plannedReplacementOn: day(-1), replacedById: null });
    expect((await deliver(provisional.body.id, day(-30), 'PSI-P')).status).toBe(200);

    const file = (await get('dentist', `/api/sites/${siteIds[21]}`)).body;
    expect(file.restoration).toMatchObject({
      id: provisional.body.id,
      provisional: true,
      plannedReplacementOn: day(-1),
    });

    // Yesterday was the planned day: overdue today, on the desk's filter with its flag.
    const desk = async () =>
      (await get('hygienist', '/api/recalls/desk', { filter: 'provisional-overdue', pageSize: 100 })).body;
    const listed = await desk();
    const row = listed.items.find((r: { patientId: string }) => r.patientId === patientId);
    expect(row.provisionalsOverdue).toEqual([
      { restorationId: provisional.body.id, fdis: [21], plannedReplacementOn: day(-1) },
    ]);

    const definitive = await send('dentist', 'post', '/api/restorations', { ...crown, material: 'zirconia' });
    expect(definitive.status, JSON.stringify(definitive.body)).toBe(201);
    expect(definitive.body.provisional).toBe(false);
    expect((await deliver(definitive.body.id, day(0), 'PSI-D')).status).toBe(200);

    // Kept, marked replaced by the definitive; off the desk's filter; both in the Timeline.
    const old = (await get('dentist', `/api/restorations/${provisional.body.id}`)).body;
    expect(old).toMatchObject({ status: 'removed', provisional: true, replacedById: definitive.body.id });
    const after = await desk();
    expect(after.items.map((r: { patientId: string }) => r.patientId)).not.toContain(patientId);
    expect((await get('dentist', `/api/sites/${siteIds[21]}`)).body.restoration).toMatchObject({
      id: definitive.body.id,
      provisional: false,
    });
    const timeline = (await get('dentist', `/api/sites/${siteIds[21]}/timeline`)).body;
    const deliveries = timeline.events.filter((e: { kind: string }) => e.kind === 'delivery');
    expect(deliveries.map((e: { title: string; detail: string }) => [e.title.split(':')[0], e.detail])).toEqual(
      expect.arrayContaining([
        ['Provisional restoration delivered', 'Retrievable; replaced by the definitive restoration'],
        ['Restoration delivered', 'Retrievable; replaces the provisional'],
      ]),
    );
  });

  it("lists the demo's Signe Marchetti, whose provisional crown at 21 is overdue", async () => {
    const desk = (await get('dentist', '/api/recalls/desk', { filter: 'provisional-overdue', pageSize: 100 })).body;
    const signe = desk.items.find((r: { name: string }) => r.name === 'Signe Marchetti');
    expect(signe.provisionalsOverdue).toEqual([expect.objectContaining({ fdis: [21] })]);
    expect(signe.provisionalsOverdue[0].plannedReplacementOn < desk.today).toBe(true);
    // The desk's other rows are not provisionals: no seeded patient but Signe has one.
    expect(desk.items.map((r: { name: string }) => r.name)).toEqual(['Signe Marchetti']);
  });
});
