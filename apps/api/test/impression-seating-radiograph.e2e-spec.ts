// A seating radiograph of the scan bodies, asked for where the practice requires it (issue 16,
// item 4): a practice setting, off by default; when on, a digital impression without a radiograph
// linked as its seating check carries a warning Finding [common practice], gone once one is linked.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jpeg } from './support/radiograph-fixtures.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let t: Awaited<ReturnType<typeof scenarioTargets>>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  t = await scenarioTargets(ctx, cookies);
}, 90_000);
afterAll(() => ctx.close());

const setting = (value: boolean) =>
  ctx.http
    .put('/api/practice/impression-settings')
    .set('Cookie', cookies.practice_admin)
    .send({ requireScanBodyRadiograph: value });
const findingsOf = async (restorationId: string) =>
  (
    (await ctx.http.get(`/api/restorations/${restorationId}/impressions`).set('Cookie', cookies.dentist)).body as {
      findings: { code: string; severity: string }[];
    }
  ).findings.map((f) => [f.severity, f.code]);
const restorationOf = async (impressionId: string) =>
  (await ctx.db.query.impressions.findFirst({ where: (i, { eq }) => eq(i.id, impressionId) }))!.restorationId;

describe('seating radiograph of the scan bodies', () => {
  it('is not asked for by default; once the practice asks, a digital impression without one has a warning until one is linked', async () => {
    expect((await ctx.http.get('/api/practice/impression-settings').set('Cookie', cookies.dentist)).body).toEqual({
      requireScanBodyRadiograph: false,
    });
    const restoration = await restorationOf(await t.fresh.impression());
    expect(await findingsOf(restoration)).toEqual([]);

    expect((await setting(true)).status).toBe(200);
    try {
      expect(await findingsOf(restoration)).toEqual([['warning', 'scan-body-seating-radiograph-missing']]);

      const radiograph = await ctx.http
        .post(`/api/patients/${t.ids.wendell}/radiographs?siteIds=${t.ids.wendell15},${t.ids.wendell16}`)
        .set('Cookie', cookies.dentist)
        .set('Content-Type', 'application/octet-stream')
        .send(await jpeg(8, 8, 77));
      expect(radiograph.status, JSON.stringify(radiograph.body)).toBe(201);
      const linked = await ctx.http
        .post(`/api/restorations/${restoration}/seating-checks`)
        .set('Cookie', cookies.dentist)
        .send({ event: 'impression', radiographId: radiograph.body.id, seated: 'yes' });
      expect(linked.status, JSON.stringify(linked.body)).toBe(201);
      expect(await findingsOf(restoration)).toEqual([]);
    } finally {
      await setting(false);
    }
  });

  it('asks nothing of an analog impression, and only the practice admin sets it', async () => {
    const plan = await t.fresh.plan();
    const analog = await ctx.http
      .post(`/api/restorations/${plan}/impressions`)
      .set('Cookie', cookies.dentist)
      .send({ method: 'analog', takenOn: '2026-11-20' });
    expect(analog.status).toBe(201);
    expect((await setting(true)).status).toBe(200);
    try {
      expect(await findingsOf(plan)).toEqual([]);
      const byDentist = await ctx.http
        .put('/api/practice/impression-settings')
        .set('Cookie', cookies.dentist)
        .send({ requireScanBodyRadiograph: false });
      expect(byDentist.status).toBe(403);
    } finally {
      await setting(false);
    }
  });
});
