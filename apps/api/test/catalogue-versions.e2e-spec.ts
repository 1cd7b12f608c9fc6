// Versioned catalogue (ADR 0006): an edit of a part or wrench saves a new version; records keep
// the version they used and new work uses the current one. Wrench calibrations are a history.
// Verdicts are torqueVerdict's (docs/clinical-rules.md §6); the values are invented test parts.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { componentInstances, torqueEvents } from '../src/db/schema/index.js';
import { patientWithImplants, testPlatform, type TestPlatform } from './support/ledger-fixtures.js';
import { startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let admin: string;
let dentist: string;
let practiceId: string;
let platform: string;
let newPart: TestPlatform['newPart'];
/** A new prosthetic screw of its own (25 N·cm ±10 %), so no other test sees its edits. */
const newScrew = () => newPart('prosthetic-screw', { torqueSpecNcm: 25, tolerancePct: 10 });
beforeAll(async () => {
  ctx = await startTestApp();
  ({ admin, dentist, practiceId, platform, newPart } = await testPlatform(ctx, 'TV'));
});
afterAll(() => ctx.close());

/** The screw installed at 35 of a new patient. */
async function installed(componentId: string, chart: string) {
  const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Solvra CN 4.3', [{ fdi: 35 }]);
  const [row] = await ctx.db
    .insert(componentInstances)
    .values({ practiceId, patientId, siteId: siteIds[35], componentId, lot: 'L-1', installedOn: '2026-10-15' })
    .returning({ id: componentInstances.id });
  return { siteId: siteIds[35], instanceId: row.id };
}

const editPart = (id: string, body: object) =>
  ctx.http.patch(`/api/catalogue/components/${id}`).set('Cookie', admin).send(body);
const logTorque = (body: object) => ctx.http.post('/api/torque-events').set('Cookie', dentist).send(body);
const siteFile = async (id: string) => (await ctx.http.get(`/api/sites/${id}`).set('Cookie', dentist)).body;

describe('catalogue part versions', () => {
  it('keeps an old torque entry on its spec and verdict after an edit; the Stack flags the newer version', async () => {
    const v1 = await newScrew();
    expect(v1.version).toBe(1);
    const { siteId, instanceId } = await installed(v1.id, 'T-CV1');
    const old = await logTorque({ componentInstanceId: instanceId, appliedNcm: 25, reason: 'initial-seating' });
    expect(old.status).toBe(201);
    expect(old.body).toMatchObject({ specNcm: 25, verdict: 'within' });

    const edited = await editPart(v1.id, { torqueSpecNcm: 40, tolerancePct: 5 });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ torqueSpecNcm: 40, tolerancePct: 5, version: 2, inUse: true });
    expect(edited.body.id).not.toBe(v1.id);

    // The Stack shows the part as installed and says the catalogue changed since.
    const part = (await siteFile(siteId)).parts.find((p: { instanceId: string }) => p.instanceId === instanceId);
    expect(part).toMatchObject({
      componentId: v1.id,
      torqueSpecNcm: 25,
      tolerancePct: 10,
      lastTorque: { id: old.body.id, specNcm: 25, tolerancePct: 10, verdict: 'within' },
      newerVersion: { componentId: edited.body.id, torqueSpecNcm: 40, tolerancePct: 5 },
    });

    // A new torque on the same part is judged against the current version: 25 is now under 40.
    const next = await logTorque({ componentInstanceId: instanceId, appliedNcm: 25, reason: 're-torque-at-recall' });
    expect(next.status).toBe(201);
    expect(next.body).toMatchObject({ specNcm: 40, tolerancePct: 5, verdict: 'under' });

    // The chart's points carry the spec each entry was judged against, not today's.
    const timeline = (await ctx.http.get(`/api/sites/${siteId}/timeline`).set('Cookie', dentist)).body;
    const series = timeline.torqueSeries.find(
      (s: { componentInstanceId: string }) => s.componentInstanceId === instanceId,
    );
    expect(series.points).toEqual([
      expect.objectContaining({ id: old.body.id, specNcm: 25, tolerancePct: 10, verdict: 'within' }),
      expect.objectContaining({ id: next.body.id, specNcm: 40, tolerancePct: 5, verdict: 'under' }),
    ]);
    const [stored] = await ctx.db
      .select({ specNcm: torqueEvents.specNcm, verdict: torqueEvents.verdict })
      .from(torqueEvents)
      .where(eq(torqueEvents.id, old.body.id));
    expect(stored).toEqual({ specNcm: 25, verdict: 'within' });
  });

  it('lists only the current version, keeps every version in the history and refuses editing an old one', async () => {
    const v1 = await newScrew();
    const v2 = (await editPart(v1.id, { name: 'Prosthetic screw, renamed' })).body;
    const v3 = (await editPart(v2.id, { torqueSpecNcm: 30 })).body;
    expect(v3.version).toBe(3);
    // Saving what is already there makes no version.
    expect((await editPart(v3.id, { torqueSpecNcm: 30 })).body).toMatchObject({ id: v3.id, version: 3 });

    const stale = await editPart(v1.id, { torqueSpecNcm: 35 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/newer version/);

    const catalogue = (await ctx.http.get('/api/catalogue').set('Cookie', dentist)).body;
    const ids = catalogue.systems.flatMap((s: { platforms: { components: { id: string }[] }[] }) =>
      s.platforms.flatMap((p) => p.components.map((c) => c.id)),
    );
    expect(ids).toContain(v3.id);
    expect(ids).not.toContain(v1.id);
    expect(ids).not.toContain(v2.id);

    const history = await ctx.http.get(`/api/catalogue/components/${v1.id}/versions`).set('Cookie', dentist);
    expect(history.status).toBe(200);
    expect(
      history.body.items.map((v: { id: string; version: number; current: boolean; torqueSpecNcm: number }) => [
        v.id,
        v.version,
        v.current,
        v.torqueSpecNcm,
      ]),
    ).toEqual([
      [v1.id, 1, false, 25],
      [v2.id, 2, false, 25],
      [v3.id, 3, true, 30],
    ]);
    expect(history.body.items[1]).toMatchObject({ name: 'Prosthetic screw, renamed', byName: expect.any(String) });
  });

  it('a new delivery installs the current version even when the plan named an older one', async () => {
    const v1 = await newScrew();
    const { patientId, siteIds } = await patientWithImplants(ctx, 'T-CV3', 'Solvra CN 4.3', [{ fdi: 36 }]);
    const coping = await ctx.http.get('/api/catalogue').set('Cookie', dentist);
    const copingId = coping.body.systems
      .flatMap((s: { platforms: { id: string; components: { id: string; kind: string; tray: string }[] }[] }) =>
        s.platforms.filter((p) => p.id === platform).flatMap((p) => p.components),
      )
      .find(
        (c: { kind: string; engaging: boolean | null }) => c.kind === 'impression-coping' && c.engaging === true,
      ).id;
    const planned = await ctx.http
      .post('/api/restorations')
      .set('Cookie', dentist)
      .send({
        patientId,
        kind: 'single-crown',
        retention: 'screw-to-implant',
        material: 'zirconia',
        sites: [
          {
            siteId: siteIds[36],
            interface: 'engaging',
            impressionCoping: 'engaging',
            restorativeSpaceMm: 7,
            screwComponentIds: [v1.id],
            impressionCopingComponentId: copingId,
          },
        ],
      });
    expect(planned.status, JSON.stringify(planned.body)).toBe(201);
    const v2 = (await editPart(v1.id, { torqueSpecNcm: 32 })).body;

    // The plan keeps the version it named.
    const plan = (await ctx.http.get(`/api/restorations/${planned.body.id}`).set('Cookie', dentist)).body;
    expect(plan.sites[0].components.map((c: { id: string }) => c.id)).toContain(v1.id);

    const delivered = await ctx.http
      .post(`/api/restorations/${planned.body.id}/delivery`)
      .set('Cookie', dentist)
      .send({ deliveredOn: '2026-11-20', parts: [{ siteId: siteIds[36], componentId: v1.id, lot: 'L-36' }] });
    expect(delivered.status, JSON.stringify(delivered.body)).toBe(200);
    const part = (await siteFile(siteIds[36])).parts.find((p: { kind: string }) => p.kind === 'prosthetic-screw');
    expect(part).toMatchObject({ componentId: v2.id, torqueSpecNcm: 32, newerVersion: null });
  });
});

describe('wrench versions and calibration history', () => {
  const wrenchReq = () => ctx.http;
  it('adds calibrations to the history, never overwriting, and refuses a future date', async () => {
    const created = await wrenchReq()
      .post('/api/wrenches')
      .set('Cookie', admin)
      .send({ label: 'Spring wrench T', type: 'spring', lastCalibratedOn: '2025-11-01' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ lastCalibratedOn: '2025-11-01', version: 1 });
    const id = created.body.id as string;

    const added = await wrenchReq()
      .post(`/api/wrenches/${id}/calibrations`)
      .set('Cookie', admin)
      .send({ calibratedOn: '2026-11-02', note: 'Annual service' });
    expect(added.status).toBe(201);
    expect(added.body).toMatchObject({
      calibratedOn: '2026-11-02',
      note: 'Annual service',
      byName: expect.any(String),
    });

    const tomorrow = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
    const future = await wrenchReq()
      .post(`/api/wrenches/${id}/calibrations`)
      .set('Cookie', admin)
      .send({ calibratedOn: tomorrow });
    expect(future.status).toBe(400);
    expect(future.body.fields).toHaveProperty('calibratedOn');
    const futureNew = await wrenchReq()
      .post('/api/wrenches')
      .set('Cookie', admin)
      .send({ label: 'Spring wrench U', type: 'spring', lastCalibratedOn: tomorrow });
    expect(futureNew.status).toBe(400);
    expect(futureNew.body.fields).toHaveProperty('lastCalibratedOn');

    // A new version of the wrench keeps the instrument's history.
    const renamed = await wrenchReq()
      .patch(`/api/wrenches/${id}`)
      .set('Cookie', admin)
      .send({ label: 'Spring wrench T2' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ label: 'Spring wrench T2', version: 2, lastCalibratedOn: '2026-11-02' });
    expect((await wrenchReq().patch(`/api/wrenches/${id}`).set('Cookie', admin).send({ label: 'x' })).status).toBe(409);

    const history = await wrenchReq().get(`/api/wrenches/${renamed.body.id}/calibrations`).set('Cookie', dentist);
    expect(history.body.items.map((c: { calibratedOn: string }) => c.calibratedOn)).toEqual([
      '2026-11-02',
      '2025-11-01',
    ]);
    const list = (await wrenchReq().get('/api/wrenches').set('Cookie', dentist)).body.items.map(
      (w: { id: string }) => w.id,
    );
    expect(list).toContain(renamed.body.id);
    expect(list).not.toContain(id);
  });

  it('a torque entry keeps the wrench version it used', async () => {
    const w1 = (
      await wrenchReq()
        .post('/api/wrenches')
        .set('Cookie', admin)
        .send({ label: 'Friction wrench V', type: 'friction' })
    ).body;
    const screw = await newScrew();
    const { instanceId } = await installed(screw.id, 'T-CV4');
    const entry = await logTorque({
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 'initial-seating',
      wrenchId: w1.id,
    });
    expect(entry.body).toMatchObject({ wrenchId: w1.id, wrenchLabel: 'Friction wrench V' });
    const w2 = (
      await wrenchReq().patch(`/api/wrenches/${w1.id}`).set('Cookie', admin).send({ label: 'Friction wrench W' })
    ).body;
    // An entry sent with the old version's id uses the current version.
    const later = await logTorque({
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      wrenchId: w1.id,
    });
    expect(later.body).toMatchObject({ wrenchId: w2.id, wrenchLabel: 'Friction wrench W' });
    const [stored] = await ctx.db
      .select({ wrenchId: torqueEvents.wrenchId })
      .from(torqueEvents)
      .where(eq(torqueEvents.id, entry.body.id));
    expect(stored.wrenchId).toBe(w1.id);
  });
});
