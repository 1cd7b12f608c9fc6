// Issue 16 item 2: retentive-insert changes of an overdenture. Logged per site (date not in the
// future, old and new insert from the catalogue, reason), amended never overwritten, audited,
// isolated per practice; the Site file shows the interval since the last change and the counts;
// the Recall desk lists an overdenture whose last change (or delivery) is older than the practice's
// interval — default 12 months [common practice]; prosthetic maintenance of overdentures as events
// per patient-year: Cehreli MC et al. 2010, Int J Oral Maxillofac Implants 25(1):163–180 [memory].
// Overdue from the day after the due day [decision]. Who may call each route: route-actor-matrix.
import { addCalendarMonths, daysBetween } from '@torquetrail/domain';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RecallClock } from '../src/recalls/recall-clock.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import { signInAll, siteId, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let part: (suffix: string) => string;
let beatrix33: string;
let beatrix43: string;
let today: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  part = await parts(ctx.db, await larkspurId(ctx.db), 'Miravik HX 4.1');
  beatrix33 = await siteId(ctx.db, 'LL-1006', 33);
  beatrix43 = await siteId(ctx.db, 'LL-1006', 43);
  today = ctx.app.get(RecallClock).today();
  // Seeding beside other test files on a shared machine can outlast the default 30 s.
}, 90_000);
afterAll(() => ctx.close());

const send = (who: AccountKey, method: 'post' | 'put', path: string, body: object) =>
  ctx.http[method](path).set('Cookie', cookies[who]).send(body);
const get = (who: AccountKey, path: string, query: object = {}) =>
  ctx.http.get(path).query(query).set('Cookie', cookies[who]);
const change = (over: object = {}) => ({
  siteId: beatrix43,
  // Older than Beatrix's last seeded change (five months ago), so her review stays where the seed put it.
  changedOn: addCalendarMonths(today, -6),
  oldComponentId: part('RI-S'),
  newComponentId: part('RI-M'),
  reason: 'wear',
  notes: 'Both inserts flattened',
  ...over,
});
/** What an amendment must name again (the recording body requires it); the rest is kept when left out. */
const required = (c: { changedOn: string; newPart: { componentId: string }; reason: string }) => ({
  changedOn: c.changedOn,
  newComponentId: c.newPart.componentId,
  reason: c.reason,
});
type DeskItem = {
  chartNumber: string;
  insertReviewsOverdue?: { fdis: number[]; lastChangeOn: string | null; reviewDueOn: string }[];
};
const overdueDesk = async () =>
  (await get('dentist', '/api/recalls/desk', { filter: 'insert-review-overdue', pageSize: 100 })).body
    .items as DeskItem[];

describe('logging an insert change', () => {
  it('the hygienist logs one at recall: the reply names both inserts with their strengths; audited', async () => {
    const res = await send('hygienist', 'post', '/api/insert-changes', change());
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      siteId: beatrix43,
      reason: 'wear',
      notes: 'Both inserts flattened',
      oldPart: { componentId: part('RI-S'), retentionLabel: 'strong', retentionN: 20 },
      newPart: { componentId: part('RI-M'), retentionLabel: 'medium', retentionN: 13 },
      supersedesId: null,
      recordedByName: 'Maren Holt',
    });
    const { rows } = await ctx.db.execute<{ action: string; patient_id: string | null }>(
      sql`select action, patient_id from audit_events where record_type = 'InsertChange' and record_id = ${res.body.id}`,
    );
    expect(rows).toEqual([{ action: 'create', patient_id: expect.any(String) }]);
    const timeline = (await get('dentist', `/api/sites/${beatrix43}/timeline`, { kinds: 'insert-change' })).body;
    expect(timeline.events.map((e: { id: string }) => e.id)).toContain(res.body.id);
  });

  it('refuses a date in the future beside the field', async () => {
    const res = await send('dentist', 'post', '/api/insert-changes', change({ changedOn: '2099-01-01' }));
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual({ changedOn: 'Cannot be in the future' });
  });

  it('refuses a site without a delivered overdenture, naming the site', async () => {
    const harold35 = await siteId(ctx.db, 'LL-1001', 35);
    const res = await send('dentist', 'post', '/api/insert-changes', change({ siteId: harold35 }));
    expect(res.status).toBe(400);
    expect(res.body.fields.siteId).toMatch(/^Site 35 carries no delivered overdenture/);
  });

  it('refuses a part that is not an insert, beside its field', async () => {
    const res = await send('dentist', 'post', '/api/insert-changes', change({ newComponentId: part('ST3') }));
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual({ newComponentId: 'Choose a retentive insert from the catalogue' });
  });

  it("another practice's dentist gets 404 for the site and for the entry", async () => {
    expect((await send('otherPracticeDentist', 'post', '/api/insert-changes', change())).status).toBe(404);
    const made = await send('dentist', 'post', '/api/insert-changes', change());
    const amend = await send('otherPracticeDentist', 'post', `/api/insert-changes/${made.body.id}/amendments`, {
      ...required(made.body),
      reason: 'fracture',
      amendmentReason: 'Not ours to amend',
    });
    expect(amend.status).toBe(404);
  });
});

describe('amending an insert change', () => {
  it('keeps the old insert and the note the amendment leaves out; a second amendment of one version is 409', async () => {
    const made = await send('dentist', 'post', '/api/insert-changes', change());
    const amended = await send('dentist', 'post', `/api/insert-changes/${made.body.id}/amendments`, {
      ...required(made.body),
      reason: 'fracture',
      amendmentReason: 'The insert had split, not worn',
    });
    expect(amended.status).toBe(201);
    expect(amended.body).toMatchObject({
      supersedesId: made.body.id,
      reason: 'fracture',
      changedOn: made.body.changedOn,
      notes: 'Both inserts flattened',
      oldPart: { componentId: part('RI-S') },
      newPart: { componentId: part('RI-M') },
      amendmentReason: 'The insert had split, not worn',
    });
    const again = await send('dentist', 'post', `/api/insert-changes/${made.body.id}/amendments`, {
      ...required(made.body),
      amendmentReason: 'Second try',
    });
    expect(again.status).toBe(409);
    // The Site file lists the current version only; the Timeline keeps both, the old one marked.
    const file = (await get('dentist', `/api/sites/${beatrix43}`)).body;
    const ids = file.insertChanges.entries.map((e: { id: string }) => e.id);
    expect(ids).toContain(amended.body.id);
    expect(ids).not.toContain(made.body.id);
    const events = (await get('dentist', `/api/sites/${beatrix43}/timeline`, { kinds: 'insert-change' })).body
      .events as { id: string; amended: boolean }[];
    expect(events.find((e) => e.id === made.body.id)?.amended).toBe(true);
    expect(events.find((e) => e.id === amended.body.id)?.amended).toBe(false);
  });

  it('refuses an amendment dated in the future', async () => {
    const made = await send('dentist', 'post', '/api/insert-changes', change());
    const res = await send('dentist', 'post', `/api/insert-changes/${made.body.id}/amendments`, {
      ...required(made.body),
      changedOn: '2099-01-01',
      amendmentReason: 'Typed the wrong year',
    });
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual({ changedOn: 'Cannot be in the future' });
  });
});

describe('the Site file', () => {
  it("shows Beatrix's seeded yearly changes: the interval since the last, the counts per 12 months and per year", async () => {
    // Seeded (demo-overdentures.ts): yearly changes, the last five months ago; 33 skipped the fracture year.
    const file = (await get('hygienist', `/api/sites/${beatrix33}`)).body;
    const last = addCalendarMonths(today, -5);
    expect(file.insertChanges).toMatchObject({
      reviewIntervalMonths: 12,
      lastChangeOn: last,
      daysSinceLast: daysBetween(last, today),
      monthsSinceLast: 5,
      last12Months: 1,
      reviewDueOn: addCalendarMonths(last, 12),
      reviewOverdue: false,
    });
    const perYear = file.insertChanges.perYear as { year: number; count: number }[];
    expect(perYear.reduce((n, y) => n + y.count, 0)).toBe(file.insertChanges.entries.length);
    expect(perYear.every((y) => y.count === 1)).toBe(true);
    expect(file.insertChanges.entries[0]).toMatchObject({ changedOn: last, newPart: { retentionLabel: 'strong' } });
  });

  it('has no insert record on a site without an overdenture, and none for a shared surgeon', async () => {
    const harold35 = await siteId(ctx.db, 'LL-1001', 35);
    expect((await get('dentist', `/api/sites/${harold35}`)).body.insertChanges).toBeNull();
    const shared = await get('surgeon', `/api/sites/${harold35}`);
    expect(shared.status).toBe(200);
    expect(shared.body).not.toHaveProperty('insertChanges');
  });
});

describe('the Recall desk', () => {
  it('lists an overdenture past its insert review, from the day after the due day, at the practice interval', async () => {
    const clock = ctx.app.get(RecallClock);
    try {
      // Otto Ravensworth's bar (delivered 2021-03-01, no change logged): due 2022-03-01 at 12 months.
      clock.pin('2022-03-01');
      expect((await overdueDesk()).map((r) => r.chartNumber)).not.toContain('LL-1007');
      clock.pin('2022-03-02');
      const otto = (await overdueDesk()).find((r) => r.chartNumber === 'LL-1007');
      expect(otto?.insertReviewsOverdue).toEqual([
        expect.objectContaining({ fdis: [12, 14, 22, 24], lastChangeOn: null, reviewDueOn: '2022-03-01' }),
      ]);
    } finally {
      clock.pin(null);
    }
    // Today: Otto is overdue, Beatrix (changed five months ago) is not.
    const listed = (await overdueDesk()).map((r) => r.chartNumber);
    expect(listed).toContain('LL-1007');
    expect(listed).not.toContain('LL-1006');
    // The practice's interval rules: at 4 months Beatrix is overdue too. Only the admin sets it; audited.
    expect(
      (await send('hygienist', 'put', '/api/practice/insert-review-settings', { insertReviewIntervalMonths: 4 }))
        .status,
    ).toBe(403);
    const bad = await send('practice_admin', 'put', '/api/practice/insert-review-settings', {
      insertReviewIntervalMonths: 0,
    });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.insertReviewIntervalMonths).toBe('Whole months from 1 to 60');
    const set = await send('practice_admin', 'put', '/api/practice/insert-review-settings', {
      insertReviewIntervalMonths: 4,
    });
    expect(set.body).toEqual({ insertReviewIntervalMonths: 4 });
    try {
      expect((await overdueDesk()).map((r) => r.chartNumber)).toContain('LL-1006');
      expect((await get('dentist', '/api/practice/insert-review-settings')).body).toEqual({
        insertReviewIntervalMonths: 4,
      });
      const { rows } = await ctx.db.execute<{ action: string }>(
        sql`select action from audit_events where route = 'PUT /practice/insert-review-settings' and outcome = 'allowed'`,
      );
      expect(rows).toEqual([{ action: 'policy-change' }]);
    } finally {
      await send('practice_admin', 'put', '/api/practice/insert-review-settings', { insertReviewIntervalMonths: 12 });
    }
    // An insert change logged today at one of Otto's clips takes the whole bar off the list.
    const clip = await send('dentist', 'post', '/api/insert-changes', {
      siteId: await siteId(ctx.db, 'LL-1007', 12),
      changedOn: today,
      oldComponentId: null,
      newComponentId: (await parts(ctx.db, await larkspurId(ctx.db), 'Solvra CN 4.3'))('BC'),
      reason: 'retention-loss',
    });
    expect(clip.status).toBe(201);
    expect((await overdueDesk()).map((r) => r.chartNumber)).not.toContain('LL-1007');
  });
});
