// Torque entry (verdict from torqueVerdict, docs/clinical-rules.md §6), the re-torque reminder
// (RETIGHTEN_AFTER_MINUTES, Siamos et al. 2002), screw replacement, complications, amendments
// and the Site file's Timeline.
import { RETIGHTEN_AFTER_MINUTES, RULES_VERSION } from '@torquetrail/domain';
import { eq, ne } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { componentInstances, torqueEvents, torqueWrenches } from '../src/db/schema/index.js';
import { larkspurId, patientWithPart } from './support/ledger-fixtures.js';
import { signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let harold35: string;
let haroldScrew: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  harold35 = await siteId(ctx.db, 'LL-1001', 35);
  const [row] = await ctx.db
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .where(eq(componentInstances.siteId, harold35));
  haroldScrew = row.id;
});
afterAll(() => ctx.close());

const logTorque = (body: object) => ctx.http.post('/api/torque-events').set('Cookie', dentist).send(body);
const siteFile = async (id = harold35) => (await ctx.http.get(`/api/sites/${id}`).set('Cookie', dentist)).body;
const timeline = async (query = '', site = harold35) =>
  (await ctx.http.get(`/api/sites/${site}/timeline${query}`).set('Cookie', dentist)).body;
/**
 * The same prosthetic screw as Harold's 35 (Solvra CN 4.3, 25 N·cm ±10 %) on a new patient, for
 * the tests that read the last torque, the reminder or the Stack: entries of other tests on
 * Harold's screw, and the order they run in, cannot change what these see.
 */
let freshScrews = 0;
const freshScrew = async () => patientWithPart(ctx, `T-TQ${++freshScrews}`, 'Solvra CN 4.3', 'PSI');

describe('torque entry', () => {
  it.each([0, 0.5, 100.5, 250, -3])('refuses %s N·cm (outside 1–100) with 400 on appliedNcm', async (appliedNcm) => {
    const res = await logTorque({ componentInstanceId: haroldScrew, appliedNcm, reason: 're-torque-at-recall' });
    expect(res.status).toBe(400);
    expect(res.body.fields.appliedNcm).toMatch(/between 1 and 100/);
  });

  it('refuses a hand-tight part, a wrench of another practice and a future time', async () => {
    const healing = (await siteFile(await siteId(ctx.db, 'LL-1005', 15))).parts[0];
    expect(
      (await logTorque({ componentInstanceId: healing.instanceId, appliedNcm: 10, reason: 'initial-seating' })).body
        .fields,
    ).toHaveProperty('componentInstanceId');
    const [foreign] = await ctx.db
      .select({ id: torqueWrenches.id })
      .from(torqueWrenches)
      .where(ne(torqueWrenches.practiceId, await larkspurId(ctx.db)));
    expect(
      (
        await logTorque({
          componentInstanceId: haroldScrew,
          appliedNcm: 25,
          reason: 're-torque-at-recall',
          wrenchId: foreign.id,
        })
      ).body.fields,
    ).toHaveProperty('wrenchId');
    expect(
      (
        await logTorque({
          componentInstanceId: haroldScrew,
          appliedNcm: 25,
          reason: 're-torque-at-recall',
          performedAt: '2099-01-01T00:00:00Z',
        })
      ).body.fields,
    ).toHaveProperty('performedAt');
  });

  // The demo catalogue's prosthetic screw: 25 N·cm ± 10 % [common practice, manufacturer-specific];
  // torqueVerdict's window is inclusive at both ends [decision, docs/clinical-rules.md §6].
  it('stores the verdict against the part spec and tolerance with the rules version (25 N·cm ±10 %: 22.5–27.5 within)', async () => {
    const { siteId: site, instanceId: screw } = await freshScrew();
    const under = await logTorque({ componentInstanceId: screw, appliedNcm: 22, reason: 're-torque-at-recall' });
    expect(under.status).toBe(201);
    expect(under.body).toMatchObject({
      appliedNcm: 22,
      specNcm: 25,
      tolerancePct: 10,
      verdict: 'under',
      rulesVersion: RULES_VERSION,
    });
    const edge = await logTorque({ componentInstanceId: screw, appliedNcm: 27.5, reason: 're-torque-at-recall' });
    expect(edge.body.verdict).toBe('within');
    const over = await logTorque({ componentInstanceId: screw, appliedNcm: 28, reason: 're-torque-at-recall' });
    expect(over.body.verdict).toBe('over');
    expect((await siteFile(site)).parts[0].lastTorque).toMatchObject({ appliedNcm: 28, verdict: 'over' });
  });

  it('shows the re-torque reminder after an initial seating until a re-torque is logged', async () => {
    const { siteId: site, instanceId: screw } = await freshScrew();
    // A second ahead of now (the server accepts a few minutes of clock skew).
    const seatedAt = new Date(Date.now() + 1000);
    await logTorque({
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 'initial-seating',
      performedAt: seatedAt.toISOString(),
    });
    const due = (await siteFile(site)).parts[0].retorqueDueAt;
    expect(new Date(due).getTime()).toBe(seatedAt.getTime() + RETIGHTEN_AFTER_MINUTES * 60_000);
    await logTorque({
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 're-torque-after-settling',
      performedAt: new Date(seatedAt.getTime() + 60_000).toISOString(),
      // One minute is earlier than the settling time: saved only as a confirmed early re-torque.
      confirmEarlySettling: true,
    });
    expect((await siteFile(site)).parts[0].retorqueDueAt).toBeNull();
  });

  it('screw-replaced retires the old instance and starts a new one that replaces it (lot required)', async () => {
    const { siteId: site, instanceId: screw } = await freshScrew();
    // A history before the replacement, whose series must stay in the Timeline.
    expect(
      (
        await logTorque({
          componentInstanceId: screw,
          appliedNcm: 25,
          reason: 're-torque-at-recall',
          performedAt: '2026-11-02T10:00:00Z',
        })
      ).status,
    ).toBe(201);
    const noLot = await logTorque({ componentInstanceId: screw, appliedNcm: 25, reason: 'screw-replaced' });
    expect(noLot.status).toBe(400);
    expect(noLot.body.fields).toHaveProperty('replacementLot');
    const res = await logTorque({
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 'screw-replaced',
      replacementLot: 'PSI-2611-02',
    });
    expect(res.status).toBe(201);
    const fresh = res.body.replacementInstanceId;
    expect(fresh).not.toBe(screw);
    const [old] = await ctx.db.select().from(componentInstances).where(eq(componentInstances.id, screw));
    const [replacement] = await ctx.db.select().from(componentInstances).where(eq(componentInstances.id, fresh));
    expect(old.removedOn).not.toBeNull();
    expect(replacement).toMatchObject({ replacesId: screw, lot: 'PSI-2611-02', removedOn: null });
    const file = await siteFile(site);
    expect(file.parts.map((p: { instanceId: string }) => p.instanceId)).toEqual([fresh]);
    expect(file.parts[0].retorqueDueAt).not.toBeNull();
    // The removed screw's history is kept: torque on it is refused, its series stays in the Timeline.
    expect(
      (await logTorque({ componentInstanceId: screw, appliedNcm: 25, reason: 're-torque-at-recall' })).status,
    ).toBe(409);
    const { torqueSeries } = await timeline('', site);
    expect(torqueSeries.map((s: { componentInstanceId: string }) => s.componentInstanceId)).toEqual([screw, fresh]);
    expect(torqueSeries[0].removedOn).not.toBeNull();
  });

  it('an amendment is a new version; the old entry stays in the Timeline marked as amended', async () => {
    const first = await logTorque({
      componentInstanceId: haroldScrew,
      appliedNcm: 20,
      reason: 're-torque-after-settling',
      performedAt: new Date().toISOString(),
    });
    const amended = await ctx.http
      .post(`/api/torque-events/${first.body.id}/amendments`)
      .set('Cookie', dentist)
      .send({ appliedNcm: 25, performedAt: first.body.performedAt, amendmentReason: 'Entered the wrong reading' });
    expect(amended.status).toBe(201);
    expect(amended.body).toMatchObject({
      supersedesId: first.body.id,
      verdict: 'within',
      amendmentReason: 'Entered the wrong reading',
      reason: 're-torque-after-settling',
    });
    const again = await ctx.http
      .post(`/api/torque-events/${first.body.id}/amendments`)
      .set('Cookie', dentist)
      .send({ appliedNcm: 26, performedAt: first.body.performedAt, amendmentReason: 'Twice' });
    expect(again.status).toBe(409);
    expect(await ctx.db.select().from(torqueEvents).where(eq(torqueEvents.id, first.body.id))).toHaveLength(1);
    const { events } = await timeline('?kinds=torque');
    expect(events.find((e: { id: string }) => e.id === first.body.id)).toMatchObject({ amended: true });
    expect(events.find((e: { id: string }) => e.id === amended.body.id)).toMatchObject({
      amended: false,
      supersedesId: first.body.id,
    });
  });
});

describe('complications and the Timeline', () => {
  it("tells Harold Whitcombe's 35 from 2012 to now in time order, the 2016 loosening beside its torque entries", async () => {
    const { events } = await timeline();
    const kinds = events.map((e: { kind: string }) => e.kind);
    expect(kinds[0]).toBe('placement');
    const days = events.map((e: { at: string }) => e.at.slice(0, 10));
    expect(days).toEqual([...days].sort((a, b) => a.localeCompare(b)));
    for (const k of ['placement', 'plan', 'impression', 'delivery', 'part', 'torque', 'complication'])
      expect(kinds).toContain(k);
    const may2016 = events.filter((e: { at: string }) => e.at.startsWith('2016-05-10'));
    expect(may2016.map((e: { kind: string }) => e.kind)).toEqual(['complication', 'torque', 'torque']);
    expect(may2016[0].title).toMatch(/screw loosening/);
    expect(may2016[1].title).toMatch(/loosening found/);
  });

  it('filters by kind and refuses an unknown kind', async () => {
    const { events } = await timeline('?kinds=complication,placement');
    expect(new Set(events.map((e: { kind: string }) => e.kind))).toEqual(new Set(['complication', 'placement']));
    const bad = await ctx.http.get(`/api/sites/${harold35}/timeline?kinds=gossip`).set('Cookie', dentist);
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toHaveProperty('kinds');
  });

  it('records a complication on a part, refuses a part of another site, and amends it', async () => {
    const other = (await siteFile(await siteId(ctx.db, 'LL-1001', 37))).parts[0].instanceId;
    const foreign = await ctx.http
      .post('/api/complications')
      .set('Cookie', dentist)
      .send({ siteId: harold35, componentInstanceId: other, kind: 'screw-fracture', occurredOn: '2026-11-01' });
    expect(foreign.status).toBe(400);
    expect(foreign.body.fields).toHaveProperty('componentInstanceId');
    const created = await ctx.http.post('/api/complications').set('Cookie', dentist).send({
      siteId: harold35,
      componentInstanceId: haroldScrew,
      kind: 'screw-fracture',
      occurredOn: '2026-11-01',
      notes: 'Head sheared',
    });
    expect(created.status).toBe(201);
    const amended = await ctx.http
      .post(`/api/complications/${created.body.id}/amendments`)
      .set('Cookie', dentist)
      .send({
        componentInstanceId: haroldScrew,
        kind: 'screw-loosening',
        occurredOn: '2026-11-01',
        amendmentReason: 'It was loose, not broken',
      });
    expect(amended.status).toBe(201);
    const { events } = await timeline('?kinds=complication');
    expect(
      events
        .filter((e: { at: string }) => e.at.startsWith('2026-11-01'))
        .map((e: { amended: boolean; title: string }) => [e.amended, e.title]),
    ).toEqual([
      [true, 'Complication: screw fracture (Prosthetic screw, implant level)'],
      [false, 'Complication: screw loosening (Prosthetic screw, implant level)'],
    ]);
  });

  it('shows the hygienist the Timeline and the surgeon only shared patients', async () => {
    const hygienist = await signIn(ctx, 'hygienist');
    const res = await ctx.http.get(`/api/sites/${harold35}/timeline`).set('Cookie', hygienist);
    expect(res.status).toBe(200);
    expect(res.body.events.length).toBeGreaterThan(5);
  });
});
