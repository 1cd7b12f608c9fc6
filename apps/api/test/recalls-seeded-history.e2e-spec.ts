// The seeded recall history as the recall routes show it, before any visit changes it: in a file
// of its own, since every visit recorded by recalls-exams.e2e-spec.ts moves a due date or a status.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RecallClock } from '../src/recalls/recall-clock.js';
import { actorCookies } from './support/role-matrix.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let today: string;

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  today = ctx.app.get(RecallClock).today();
  ids.whitcombe = await patientId(ctx.db, 'LL-1001');
  ids.wendell = await patientId(ctx.db, 'LL-1005');
  ids.whitcombe35 = await siteId(ctx.db, 'LL-1001', 35);
});
afterAll(() => ctx.close());

describe('the seeded recall history', () => {
  it('matches the demo scenario: Harold due in about three weeks, Imogen overdue, Desmond peri-implantitis, Wendell not examined', async () => {
    const desk = await ctx.http.get('/api/recalls/desk').set('Cookie', cookies.hygienist);
    const row = (chart: string) => desk.body.items.find((r: { chartNumber: string }) => r.chartNumber === chart);
    const daysUntil = (iso: string) => Math.round((Date.parse(iso) - Date.parse(today)) / 86_400_000);
    expect(daysUntil(row('LL-1001').nextDueOn)).toBeGreaterThanOrEqual(19);
    expect(daysUntil(row('LL-1001').nextDueOn)).toBeLessThanOrEqual(23);
    expect(row('LL-1002').overdueDays).toBeGreaterThan(0);
    expect(row('LL-1003').sites).toEqual([expect.objectContaining({ fdi: 46, status: 'peri-implantitis' })]);
    expect(row('LL-1005').sites.map((x: { status: string }) => x.status)).toEqual(['not-examined', 'not-examined']);
    expect(row('LL-1005').nextDueOn).toBeNull();
    const harold = await ctx.http
      .get(`/api/recalls/patients/${ids.whitcombe}/exam-context`)
      .set('Cookie', cookies.hygienist);
    expect(
      harold.body.sites.map((s: { fdi: number; baseline: unknown; previous: { status: string } | null }) => [
        s.fdi,
        s.baseline !== null,
        s.previous?.status,
      ]),
    ).toEqual([
      [35, true, 'health'],
      // The implant at 36 failed in 2012 (the outcomes view's event): listed, never examined.
      [36, false, undefined],
      [37, true, 'health'],
    ]);
    const file = await ctx.http.get(`/api/recalls/sites/${ids.whitcombe35}/exams`).set('Cookie', cookies.surgeon);
    expect(file.body.exams[0].examinedOn.startsWith('2013')).toBe(true);
    expect(file.body.exams.length).toBeGreaterThan(20);
    const ctxWendell = await ctx.http
      .get(`/api/recalls/patients/${ids.wendell}/exam-context`)
      .set('Cookie', cookies.hygienist);
    expect(ctxWendell.body.sites.every((s: { baseline: unknown }) => s.baseline === null)).toBe(true);
  });
});
