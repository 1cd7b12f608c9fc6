// Seat restoration: every screw of a delivered restoration in one form, one wrench and one time for
// all, each judged against its own spec (torqueVerdict, ISO 6789-1:2017 window from the catalogue),
// saved in one transaction: a refused screw saves none.
import { count, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { torqueEvents, torqueWrenches } from '../src/db/schema/index.js';
import { larkspurId, parts, patientWithImplants } from './support/ledger-fixtures.js';
import { signInAll, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let wrenchId: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  const [wrench] = await ctx.db
    .select({ id: torqueWrenches.id })
    .from(torqueWrenches)
    .where(eq(torqueWrenches.practiceId, await larkspurId(ctx.db)));
  wrenchId = wrench.id;
});
afterAll(() => ctx.close());

const post = (who: AccountKey, path: string, body: object) =>
  ctx.http.post(path).set('Cookie', cookies[who]).send(body);
const get = (who: AccountKey, path: string) => ctx.http.get(path).set('Cookie', cookies[who]);

interface Screw {
  instanceId: string;
  siteId: string;
  fdi: number;
  torqueSpecNcm: number;
  tolerancePct: number;
  seatedAt: string | null;
}

/** A splinted bridge on 15–16 of a new patient, planned and (unless told) delivered with a screw per site. */
async function bridge(chart: string, deliver = true) {
  const tex = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
  const { patientId, siteIds } = await patientWithImplants(ctx, chart, 'Tessely EX 4.1', [
    { fdi: 15, axis: [0, 0, 1] },
    { fdi: 16, axis: [0, 0, 1] },
  ]);
  const plan = await post('dentist', '/api/restorations', {
    patientId,
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
  });
  expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  const delivered = deliver
    ? await post('dentist', `/api/restorations/${plan.body.id}/delivery`, {
        deliveredOn: '2026-11-30',
        parts: [15, 16].map((fdi) => ({ siteId: siteIds[fdi], componentId: tex('PSI'), lot: `PSI-${chart}-${fdi}` })),
      })
    : null;
  expect(delivered?.status ?? 200, JSON.stringify(delivered?.body)).toBe(200);
  return { id: plan.body.id as string, patientId, siteIds };
}

describe('seat restoration', () => {
  it('lists every screw with its spec, saves all in one go with one wrench and time, and judges each', async () => {
    const b = await bridge('T-SEAT1');
    const before = await get('dentist', `/api/restorations/${b.id}/screws`);
    expect(before.status, JSON.stringify(before.body)).toBe(200);
    const screws = before.body.items as Screw[];
    expect(screws.map((s) => s.fdi)).toEqual([15, 16]);
    // Delivered, never torqued: both seating torques are missing, and the Stack and the Arch say so.
    expect(screws.map((s) => s.seatedAt)).toEqual([null, null]);
    const flags = async () => ({
      stack: await Promise.all(
        [15, 16].map(async (fdi) =>
          (await get('dentist', `/api/sites/${b.siteIds[fdi]}`)).body.parts.map(
            (p: { seatingTorqueMissing?: boolean }) => p.seatingTorqueMissing,
          ),
        ),
      ),
      arch: (await get('dentist', `/api/patients/${b.patientId}`)).body.sites.map(
        (s: { fdi: number; partsMissingSeatingTorque?: number }) => [s.fdi, s.partsMissingSeatingTorque],
      ),
    });
    expect(await flags()).toEqual({
      stack: [[true], [true]],
      arch: [
        [15, 1],
        [16, 1],
      ],
    });
    const spec = screws[0].torqueSpecNcm;
    const over = spec * (1 + screws[1].tolerancePct / 100) + 2;

    const seated = await post('dentist', `/api/restorations/${b.id}/seat`, {
      wrenchId,
      performedAt: '2026-11-30T10:00:00.000Z',
      screws: [
        { componentInstanceId: screws[0].instanceId, appliedNcm: spec },
        { componentInstanceId: screws[1].instanceId, appliedNcm: over },
      ],
    });
    expect(seated.status, JSON.stringify(seated.body)).toBe(201);
    expect(
      seated.body.items.map((e: { verdict: string; reason: string; wrenchId: string; performedAt: string }) => [
        e.verdict,
        e.reason,
        e.wrenchId,
        e.performedAt,
      ]),
    ).toEqual([
      ['within', 'initial-seating', wrenchId, '2026-11-30T10:00:00.000Z'],
      ['over', 'initial-seating', wrenchId, '2026-11-30T10:00:00.000Z'],
    ]);
    const after = await get('dentist', `/api/restorations/${b.id}/screws`);
    expect(after.body.items.map((s: Screw) => s.seatedAt)).toEqual([
      '2026-11-30T10:00:00.000Z',
      '2026-11-30T10:00:00.000Z',
    ]);
    expect(await flags()).toEqual({
      stack: [[false], [false]],
      arch: [
        [15, 0],
        [16, 0],
      ],
    });
  });

  it('saves none when one screw is refused: all in one transaction', async () => {
    const b = await bridge('T-SEAT2');
    const other = await bridge('T-SEAT3');
    const mine = (await get('dentist', `/api/restorations/${b.id}/screws`)).body.items as Screw[];
    const theirs = (await get('dentist', `/api/restorations/${other.id}/screws`)).body.items as Screw[];
    const countOf = async (ids: string[]) =>
      (await ctx.db.select({ n: count() }).from(torqueEvents).where(inArray(torqueEvents.componentInstanceId, ids)))[0]
        .n;

    const mixed = await post('dentist', `/api/restorations/${b.id}/seat`, {
      screws: [
        { componentInstanceId: mine[0].instanceId, appliedNcm: 30 },
        { componentInstanceId: theirs[0].instanceId, appliedNcm: 30 },
      ],
    });
    expect(mixed.status).toBe(400);
    expect(mixed.body.fields['screws.1.componentInstanceId']).toBe('Not a torqued part of this restoration in place');
    const twice = await post('dentist', `/api/restorations/${b.id}/seat`, {
      screws: [
        { componentInstanceId: mine[0].instanceId, appliedNcm: 30 },
        { componentInstanceId: mine[0].instanceId, appliedNcm: 31 },
      ],
    });
    expect(twice.status).toBe(400);
    const outOfRange = await post('dentist', `/api/restorations/${b.id}/seat`, {
      screws: [
        { componentInstanceId: mine[0].instanceId, appliedNcm: 30 },
        { componentInstanceId: mine[1].instanceId, appliedNcm: 300 },
      ],
    });
    expect(outOfRange.status).toBe(400);
    expect(outOfRange.body.fields['screws.1.appliedNcm']).toMatch(/between 1 and 100/);
    expect(await countOf([...mine, ...theirs].map((s) => s.instanceId))).toBe(0);
  });

  it('refuses a restoration not yet delivered, other roles and other practices', async () => {
    const planned = await bridge('T-SEAT4', false);
    expect((await get('dentist', `/api/restorations/${planned.id}/screws`)).body.items).toEqual([]);
    const early = await post('dentist', `/api/restorations/${planned.id}/seat`, {
      screws: [{ componentInstanceId: planned.patientId, appliedNcm: 30 }],
    });
    expect(early.status).toBe(409);
    expect(early.body.message).toBe('Only a delivered restoration is seated: record its delivery first');

    const b = await bridge('T-SEAT5');
    const screws = (await get('dentist', `/api/restorations/${b.id}/screws`)).body.items as Screw[];
    const body = { screws: [{ componentInstanceId: screws[0].instanceId, appliedNcm: 30 }] };
    expect((await post('hygienist', `/api/restorations/${b.id}/seat`, body)).status).toBe(403);
    expect((await post('otherPracticeDentist', `/api/restorations/${b.id}/seat`, body)).status).toBe(404);
    expect((await get('otherPracticeDentist', `/api/restorations/${b.id}/screws`)).status).toBe(404);
  });
});
