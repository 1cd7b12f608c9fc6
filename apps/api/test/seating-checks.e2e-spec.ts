// Seating confirmation (issue 10, item 7) through the real app: a radiograph attached to a
// restoration's delivery or impression with seated yes / no / unsure, amended never overwritten,
// shown in the Stack and the Timeline; the roles that may record it and the refusals in plain words.
// Radiographs, their bone levels and entered-in-error ones in the Timeline are checked here too.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendarDate } from '@torquetrail/contracts';
import { actorCookies } from './support/role-matrix.js';
import { jpeg } from './support/radiograph-fixtures.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let harold: string;
let desmond: string;
let h35: string;
let h37: string;
let d46: string;
let bridge: string;
let crown: string;
let freshPlan: () => Promise<string>;
let grey = 0;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  harold = await patientId(ctx.db, 'LL-1001');
  desmond = await patientId(ctx.db, 'LL-1003');
  h35 = await siteId(ctx.db, 'LL-1001', 35);
  h37 = await siteId(ctx.db, 'LL-1001', 37);
  d46 = await siteId(ctx.db, 'LL-1003', 46);
  const restorationOf = async (patient: string) =>
    (await ctx.http.get(`/api/patients/${patient}/restorations`).set('Cookie', cookies.dentist)).body.items[0]
      .id as string;
  bridge = await restorationOf(harold);
  crown = await restorationOf(desmond);
  freshPlan = (await scenarioTargets(ctx, cookies)).fresh.plan;
});
afterAll(() => ctx.close());

/** A new radiograph (new bytes each time) of the patient, as the hygienist files them. */
async function radiograph(patient: string, query: string): Promise<string> {
  const res = await ctx.http
    .post(`/api/patients/${patient}/radiographs?kind=periapical&${query}`)
    .set('Cookie', cookies.hygienist)
    .set('Content-Type', 'application/octet-stream')
    .send(await jpeg(16, 16, (grey += 1)));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}
const confirm = (who: AccountKey, restoration: string, body: object) =>
  ctx.http.post(`/api/restorations/${restoration}/seating-checks`).set('Cookie', cookies[who]).send(body);
const amend = (who: AccountKey, check: string, body: object) =>
  ctx.http.post(`/api/seating-checks/${check}/amendments`).set('Cookie', cookies[who]).send(body);
const stackOf = async (site: string) =>
  (await ctx.http.get(`/api/sites/${site}`).set('Cookie', cookies.dentist)).body.restoration;
const timelineOf = async (site: string) =>
  (await ctx.http.get(`/api/sites/${site}/timeline`).set('Cookie', cookies.dentist)).body.events as {
    kind: string;
    id: string;
    title: string;
    radiographId: string | null;
    enteredInErrorReason: string | null;
    amended: boolean;
    amendmentReason: string | null;
  }[];

describe('confirming seating on a radiograph', () => {
  it('records, shows in the Stack of every site of the bridge and in the Timeline, and amends with a reason', async () => {
    expect((await stackOf(h35)).seating).toBeNull(); // not checked radiographically
    const xray = await radiograph(harold, `takenOn=2012-09-20&siteIds=${h35},${h37}`);
    const first = await confirm('dentist', bridge, {
      event: 'delivery',
      radiographId: xray,
      seated: 'yes',
      note: 'No gap at either platform',
    });
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body).toMatchObject({
      restorationId: bridge,
      event: 'delivery',
      radiographId: xray,
      radiographTakenOn: '2012-09-20',
      seated: 'yes',
      note: 'No gap at either platform',
      recordedBy: 'Dr Ines Calloway',
      supersedesId: null,
      current: true,
    });
    for (const site of [h35, h37]) {
      expect((await stackOf(site)).seating).toMatchObject({
        checkId: first.body.id,
        seated: 'yes',
        radiographId: xray,
      });
    }

    // A second first check of the same delivery is refused: the first is amended instead.
    const again = await confirm('dentist', bridge, { event: 'delivery', radiographId: xray, seated: 'no' });
    expect(again.status).toBe(409);
    expect(again.body.message).toContain('amend that check instead');

    const noReason = await amend('dentist', first.body.id, { radiographId: xray, seated: 'unsure' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields.reason).toBeTruthy();
    const second = await amend('dentist', first.body.id, {
      radiographId: xray,
      seated: 'unsure',
      reason: 'Read again at higher zoom: the distal margin is not clear',
    });
    expect(second.status, JSON.stringify(second.body)).toBe(201);
    // The note the amendment leaves out is kept (amendments keep what they leave out).
    expect(second.body).toMatchObject({
      supersedesId: first.body.id,
      seated: 'unsure',
      current: true,
      note: first.body.note,
    });
    expect((await stackOf(h35)).seating).toMatchObject({ checkId: second.body.id, seated: 'unsure' });
    const stale = await amend('dentist', first.body.id, { radiographId: xray, seated: 'no', reason: 'Once more' });
    expect(stale.status).toBe(409);

    const list = await ctx.http.get(`/api/restorations/${bridge}/seating-checks`).set('Cookie', cookies.hygienist);
    expect(list.status).toBe(200);
    // Another test of this file (in any order) checks the bridge's impression: only the delivery's are these.
    expect(
      list.body.items
        .filter((c: { event: string }) => c.event === 'delivery')
        .map((c: { id: string; current: boolean }) => [c.id, c.current]),
    ).toEqual([
      [first.body.id, false],
      [second.body.id, true],
    ]);

    const ours = new Set([first.body.id, second.body.id]);
    const checks = (await timelineOf(h35)).filter((e) => e.kind === 'seating-check' && ours.has(e.id));
    expect(checks).toHaveLength(2);
    expect(checks.find((e) => e.id === first.body.id)).toMatchObject({ amended: true, radiographId: xray });
    expect(checks.find((e) => e.id === second.body.id)).toMatchObject({
      amended: false,
      amendmentReason: 'Read again at higher zoom: the distal margin is not clear',
    });
    expect(checks.find((e) => e.id === second.body.id)!.title).toBe(
      `Seating at the delivery checked on a radiograph of ${writeCalendarDate('2012-09-20', 'day-month-year')}: unclear`,
    );
  });

  it('lets only the dentist record it: the hygienist and the sharing surgeon get 403, another practice 404', async () => {
    const xray = await radiograph(harold, `siteIds=${h35}`);
    const body = { event: 'impression', radiographId: xray, seated: 'yes' };
    expect((await confirm('hygienist', bridge, body)).status).toBe(403);
    expect((await confirm('surgeon', bridge, body)).status).toBe(403);
    expect((await confirm('practice_admin', bridge, body)).status).toBe(403);
    expect((await confirm('otherPracticeDentist', bridge, body)).status).toBe(404);
    const ok = await confirm('dentist', bridge, body);
    expect(ok.status).toBe(201);
    expect((await amend('hygienist', ok.body.id, { ...body, reason: 'Wrong image' })).status).toBe(403);
    expect((await amend('otherPracticeDentist', ok.body.id, { ...body, reason: 'Wrong image' })).status).toBe(404);
    expect(
      (await ctx.http.get(`/api/restorations/${bridge}/seating-checks`).set('Cookie', cookies.otherPracticeDentist))
        .status,
    ).toBe(404);
  });

  it('refuses unusable radiographs and answers in plain words beside the field', async () => {
    const missing = await confirm('dentist', crown, { event: 'delivery' });
    expect(missing.status).toBe(400);
    expect(missing.body.fields).toMatchObject({
      radiographId: 'Choose the radiograph that shows the seating',
      seated: 'Say whether the parts are seated: yes, no or unsure',
    });

    const ofHarold = await radiograph(harold, `siteIds=${h35}`);
    const otherPatient = await confirm('dentist', crown, { event: 'delivery', radiographId: ofHarold, seated: 'yes' });
    expect(otherPatient.status).toBe(400);
    expect(otherPatient.body.fields.radiographId).toBe("Choose one of this patient's radiographs");

    const tooEarly = await radiograph(desmond, `takenOn=2014-11-02&siteIds=${d46}`);
    const early = await confirm('dentist', crown, { event: 'delivery', radiographId: tooEarly, seated: 'yes' });
    expect(early.status).toBe(400);
    expect(early.body.fields.radiographId).toBe(
      'This radiograph was taken on 2 Nov 2014, before the delivery on 18 Feb 2015; choose one taken on or after it',
    );

    const wrong = await radiograph(desmond, `takenOn=2015-02-18&siteIds=${d46}`);
    const marked = await ctx.http
      .post(`/api/radiographs/${wrong}/entered-in-error`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'Filed under the wrong date' });
    expect(marked.status).toBe(200);
    const inError = await confirm('dentist', crown, { event: 'delivery', radiographId: wrong, seated: 'yes' });
    expect(inError.status).toBe(400);
    expect(inError.body.fields.radiographId).toBe('This radiograph is marked entered in error; choose another');

    const planned = await freshPlan();
    const notYet = await confirm('dentist', planned, { event: 'delivery', radiographId: wrong, seated: 'yes' });
    expect(notYet.status).toBe(400);
    expect(notYet.body.fields.event).toBe('This restoration has not been delivered yet');
    expect((await stackOf(d46)).seating).toBeNull();
  });
});

describe('radiographs in the Timeline', () => {
  it('shows each radiograph of the site with its date and kind, its bone levels, and keeps one entered in error, marked', async () => {
    const xray = await radiograph(desmond, `takenOn=2026-02-10&siteIds=${d46}&note=Follow-up`);
    const measured = await ctx.http
      .post(`/api/radiographs/${xray}/measurements`)
      .set('Cookie', cookies.hygienist)
      .send({
        siteId: d46,
        points: {
          platform: [
            { row: 10, col: 20 },
            { row: 10, col: 40 },
          ],
          apex: { row: 90, col: 30 },
          mesial: { row: 40, col: 21 },
          distal: { row: 30, col: 39 },
        },
      });
    expect(measured.status, JSON.stringify(measured.body)).toBe(201);
    await ctx.http
      .post(`/api/radiographs/${xray}/entered-in-error`)
      .set('Cookie', cookies.hygienist)
      .send({ reason: 'Belongs to another patient' });

    const events = await timelineOf(d46);
    const entry = events.find((e) => e.kind === 'radiograph' && e.id === xray);
    expect(entry).toMatchObject({
      title: 'Radiograph (entered in error): periapical',
      radiographId: xray,
      enteredInErrorReason: 'Belongs to another patient',
      at: '2026-02-10T00:00:00.000Z',
    });
    const level = events.find((e) => e.kind === 'bone-level' && e.id === measured.body.id);
    expect(level).toMatchObject({ radiographId: xray, enteredInErrorReason: 'Belongs to another patient' });
    expect(level!.title).toBe(
      `Bone level measured: mesial ${measured.body.mesialMm.toFixed(1)} mm, distal ${measured.body.distalMm.toFixed(1)} mm`,
    );
    // The hygienist reads the same entries; another practice sees no Timeline at all.
    const asHygienist = await ctx.http.get(`/api/sites/${d46}/timeline`).set('Cookie', cookies.hygienist);
    expect(asHygienist.body.events.some((e: { id: string }) => e.id === xray)).toBe(true);
    expect((await ctx.http.get(`/api/sites/${d46}/timeline`).set('Cookie', cookies.otherPracticeDentist)).status).toBe(
      404,
    );
  });
});
