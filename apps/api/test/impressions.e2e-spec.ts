// Impressions of a restoration (issue 16, item 4) through the real app: analog, or digital with a
// scan body per site of the site's platform and its lot (the domain's checkScanBodies, common
// practice); amended, never overwritten; closed to the surgeon whatever the share.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let freshPlan: () => Promise<string>;
let w15: string;
let w16: string;
let texScanBody: string;
let otherPlatformScanBody: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  const targets = await scenarioTargets(ctx, cookies);
  freshPlan = targets.fresh.plan;
  w15 = targets.ids.wendell15;
  w16 = targets.ids.wendell16;
  texScanBody = targets.tex('SB');
  const larkspur = await larkspurId(ctx.db);
  otherPlatformScanBody = (await parts(ctx.db, larkspur, 'Solvra CN 3.5'))('SB');
});
afterAll(() => ctx.close());

const record = (who: AccountKey, restoration: string, body: object) =>
  ctx.http.post(`/api/restorations/${restoration}/impressions`).set('Cookie', cookies[who]).send(body);
const amend = (who: AccountKey, impression: string, body: object) =>
  ctx.http.post(`/api/impressions/${impression}/amendments`).set('Cookie', cookies[who]).send(body);
const list = (who: AccountKey, restoration: string) =>
  ctx.http.get(`/api/restorations/${restoration}/impressions`).set('Cookie', cookies[who]);
const digital = (
  bodies: { siteId: string; componentId: string; lot: string | null }[] = [
    { siteId: w15, componentId: texScanBody, lot: 'SB-2611-A' },
    { siteId: w16, componentId: texScanBody, lot: 'SB-2611-B' },
  ],
) => ({ method: 'digital', takenOn: '2026-11-20', scanBodies: bodies });

describe('a digital impression', () => {
  it('records a scan body per site with its lot, lists it, and refuses a second first version', async () => {
    const plan = await freshPlan();
    const res = await record('dentist', plan, { ...digital(), note: 'Scanned after tissue conditioning' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ method: 'digital', takenOn: '2026-11-20', current: true, supersedesId: null });
    expect(res.body.scanBodies.map((b: { fdi: number; lot: string }) => [b.fdi, b.lot])).toEqual([
      [15, 'SB-2611-A'],
      [16, 'SB-2611-B'],
    ]);
    const listed = await list('hygienist', plan);
    expect(listed.status).toBe(200);
    expect(listed.body.items.map((i: { id: string }) => i.id)).toEqual([res.body.id]);
    expect(listed.body.scanFiles).toEqual([]);
    const again = await record('dentist', plan, digital());
    expect(again.status).toBe(409);
    expect(again.body.message).toBe("This restoration's impression is already recorded; amend it instead");
  });

  it('refuses a scan body of another platform with a 400 naming the site', async () => {
    const res = await record(
      'dentist',
      await freshPlan(),
      digital([
        { siteId: w15, componentId: texScanBody, lot: 'L1' },
        { siteId: w16, componentId: otherPlatformScanBody, lot: 'L2' },
      ]),
    );
    expect(res.status).toBe(400);
    expect(res.body.fields['scanBodies.1.componentId']).toMatch(/the implant at site 16 is Tessely EX 4\.1$/);
  });

  it('asks for a scan body at every site, for its lot, and for a part that is a scan body', async () => {
    const plan = await freshPlan();
    const missing = await record('dentist', plan, digital([{ siteId: w15, componentId: texScanBody, lot: 'L1' }]));
    expect(missing.status).toBe(400);
    expect(missing.body.fields.scanBodies).toBe('A digital impression needs a scan body at site 16');
    const noLot = await record(
      'dentist',
      plan,
      digital([
        { siteId: w15, componentId: texScanBody, lot: null },
        { siteId: w16, componentId: texScanBody, lot: 'L2' },
      ]),
    );
    expect(noLot.status).toBe(400);
    expect(noLot.body.fields['scanBodies.0.lot']).toBe('Record the lot of the scan body at site 15');
    const larkspur = await larkspurId(ctx.db);
    const coping = (await parts(ctx.db, larkspur, 'Tessely EX 4.1'))('ICN-O');
    const notScanBody = await record(
      'dentist',
      plan,
      digital([
        { siteId: w15, componentId: coping, lot: 'L1' },
        { siteId: w16, componentId: texScanBody, lot: 'L2' },
      ]),
    );
    expect(notScanBody.body.fields['scanBodies.0.componentId']).toMatch(/at site 15 is not a scan body$/);
    const future = await record('dentist', plan, { ...digital(), takenOn: '2099-01-01' });
    expect(future.status).toBe(400);
    expect(future.body.fields.takenOn).toBe('The impression date cannot be in the future');
    // Nothing was written by the refusals: the first valid record still succeeds.
    expect((await record('dentist', plan, digital())).status).toBe(201);
  });

  it('is amended by a new version: the old one and its scan bodies stay as they were', async () => {
    const plan = await freshPlan();
    const first = (await record('dentist', plan, digital())).body;
    const lotOnly = await amend('dentist', first.id, {
      scanBodies: [
        { siteId: w15, componentId: texScanBody, lot: 'SB-2611-A' },
        { siteId: w16, componentId: texScanBody, lot: 'SB-2611-C' },
      ],
      reason: 'The lot of the 16 scan body was misread',
    });
    expect(lotOnly.status, JSON.stringify(lotOnly.body)).toBe(201);
    expect(lotOnly.body).toMatchObject({ supersedesId: first.id, takenOn: '2026-11-20', method: 'digital' });
    // A field left out keeps its value: the scan bodies stay through a date-only amendment.
    const dateOnly = await amend('dentist', lotOnly.body.id, {
      takenOn: '2026-11-19',
      reason: 'Scanned the day before',
    });
    expect(dateOnly.status).toBe(201);
    expect(dateOnly.body.scanBodies.map((b: { lot: string }) => b.lot)).toEqual(['SB-2611-A', 'SB-2611-C']);
    const again = await amend('dentist', first.id, { takenOn: '2026-11-18', reason: 'A second amendment' });
    expect(again.status).toBe(409);
    const items = (await list('dentist', plan)).body.items as {
      id: string;
      current: boolean;
      scanBodies: { lot: string }[];
    }[];
    expect(items.map((i) => i.current)).toEqual([false, false, true]);
    expect(items[0].scanBodies.map((b) => b.lot)).toEqual(['SB-2611-A', 'SB-2611-B']);
  });

  it('an analog impression takes no scan body', async () => {
    const plan = await freshPlan();
    const withBody = await record('dentist', plan, {
      method: 'analog',
      takenOn: '2026-11-20',
      scanBodies: [{ siteId: w15, componentId: texScanBody, lot: 'L1' }],
    });
    expect(withBody.status).toBe(400);
    expect(withBody.body.fields['scanBodies.0.componentId']).toBe('An analog impression takes no scan body (site 15)');
    expect((await record('dentist', plan, { method: 'analog', takenOn: '2026-11-20' })).status).toBe(201);
  });

  it('only the dentist records it; the surgeon never reads it, even through a share', async () => {
    const plan = await freshPlan();
    expect((await record('hygienist', plan, digital())).status).toBe(403);
    expect((await record('practice_admin', plan, digital())).status).toBe(403);
    expect((await list('surgeon', plan)).status).toBe(403);
    expect((await list('otherPracticeDentist', plan)).status).toBe(404);
  });

  it("the demo: Wendell's new plan is a digital impression with scan bodies and a generated scan file", async () => {
    // Other tests here plan on Wendell too: the seeded plan is the one that carries the notes.
    const wendell = (await scenarioTargets(ctx, cookies)).ids.wendell;
    const plans = (await ctx.http.get(`/api/patients/${wendell}/restorations`).set('Cookie', cookies.dentist)).body
      .items as { id: string; notes: string | null }[];
    const seeded = plans.filter((p) => p.notes === 'Digital impression after tissue conditioning');
    expect(seeded).toHaveLength(1);
    const listed = (await list('dentist', seeded[0].id)).body;
    expect(listed.items[0]).toMatchObject({ method: 'digital', current: true });
    expect(listed.items[0].scanBodies.map((b: { fdi: number; lot: string }) => [b.fdi, b.lot])).toEqual([
      [15, 'SBX41-2615'],
      [16, 'SBX41-2616'],
    ]);
    expect(listed.scanFiles).toHaveLength(1);
    const file = await ctx.http
      .get(`/api/scan-files/${listed.scanFiles[0].id}/file`)
      .set('Cookie', cookies.dentist)
      .buffer(true)
      .parse(replyBytes);
    const bytes = file.body as Buffer;
    // A binary STL: as long as its triangle count says.
    expect(bytes.length).toBe(84 + 50 * bytes.readUInt32LE(80));
    expect(bytes.length).toBe(listed.scanFiles[0].sizeBytes);
  });
});
