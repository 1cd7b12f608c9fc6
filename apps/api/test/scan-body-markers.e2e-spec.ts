// Scan-body markers (issue 16, item 4): where each recorded scan body stands on a scan file's mesh,
// picked by the clinician. Placed, moved (a new version superseding the last) and cleared by the
// dentist, read by the practice's team, never overwritten; another practice gets 404; a site
// without a recorded scan body and a point that is not finite are 400s naming what is wrong.
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, scanBodyMarkers, scanFiles } from '../src/db/schema/index.js';
import { asciiStl } from './support/mesh-fixtures.js';
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
});
afterAll(() => ctx.close());

let scale = 10;
/** A scan file on a fresh digital impression of Wendell's 15 and 16 (a scan body at each). */
async function freshScanFile(): Promise<string> {
  const res = await ctx.http
    .post(`/api/impressions/${await t.fresh.impression()}/scan-files`)
    .set('Cookie', cookies.dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(asciiStl((scale += 1)));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}
const mark = (who: AccountKey, file: string, body: object) =>
  ctx.http.post(`/api/scan-files/${file}/markers`).set('Cookie', cookies[who]).send(body);
const markers = (who: AccountKey, file: string) =>
  ctx.http.get(`/api/scan-files/${file}/markers`).set('Cookie', cookies[who]);

describe('scan-body markers on a scan file', () => {
  it('places a marker per scan body, lists it to the team, and audits it with its point', async () => {
    const file = await freshScanFile();
    const empty = await markers('hygienist', file);
    expect(empty.status).toBe(200);
    expect(empty.body.items).toEqual([]);
    const placed = await mark('dentist', file, { siteId: t.ids.wendell16, point: { x: -4.5, y: 0.25, z: 16 } });
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    expect(placed.body).toMatchObject({
      scanFileId: file,
      siteId: t.ids.wendell16,
      fdi: 16,
      point: { x: -4.5, y: 0.25, z: 16 },
      supersedesId: null,
    });
    await mark('dentist', file, { siteId: t.ids.wendell15, point: { x: 4.5, y: 0, z: 16 } });
    const listed = await markers('practice_admin', file);
    expect(listed.body.items.map((m: { fdi: number; point: object }) => [m.fdi, m.point])).toEqual([
      [15, { x: 4.5, y: 0, z: 16 }],
      [16, { x: -4.5, y: 0.25, z: 16 }],
    ]);
    const [audit] = await ctx.db
      .select({ action: auditEvents.action, after: auditEvents.after, recordType: auditEvents.recordType })
      .from(auditEvents)
      .where(eq(auditEvents.recordId, placed.body.id));
    expect(audit).toMatchObject({
      action: 'create',
      recordType: 'ScanBodyMarker',
      after: { fdi: 16, point: { x: -4.5, y: 0.25, z: 16 } },
    });
  });

  it('moving a marker is a new version superseding it; clearing is one more; the old rows stay', async () => {
    const file = await freshScanFile();
    const first = await mark('dentist', file, { siteId: t.ids.wendell15, point: { x: 1, y: 2, z: 3 } });
    const moved = await mark('dentist', file, { siteId: t.ids.wendell15, point: { x: 4, y: 5, z: 6 } });
    expect(moved.status).toBe(201);
    expect(moved.body).toMatchObject({
      supersedesId: first.body.id,
      amendmentReason: 'Moved on the mesh',
      point: { x: 4, y: 5, z: 6 },
    });
    expect((await markers('dentist', file)).body.items).toMatchObject([{ id: moved.body.id, fdi: 15 }]);
    const cleared = await mark('dentist', file, { siteId: t.ids.wendell15, point: null });
    expect(cleared.status).toBe(201);
    expect(cleared.body).toMatchObject({ supersedesId: moved.body.id, amendmentReason: 'Cleared', point: null });
    expect((await markers('dentist', file)).body.items).toEqual([]);
    // Never overwritten: every version is still there, in its chain.
    const rows = await ctx.db
      .select({ id: scanBodyMarkers.id, x: scanBodyMarkers.x, supersedesId: scanBodyMarkers.supersedesId })
      .from(scanBodyMarkers)
      .where(and(eq(scanBodyMarkers.scanFileId, file), eq(scanBodyMarkers.siteId, t.ids.wendell15)));
    expect(rows).toHaveLength(3);
    expect(rows).toContainEqual({ id: first.body.id, x: 1, supersedesId: null });
    // Nothing left to clear: a 400 naming the site.
    const again = await mark('dentist', file, { siteId: t.ids.wendell15, point: null });
    expect(again.status).toBe(400);
    expect(again.body.fields.point).toBe('No marker is placed at site 15 to clear');
  });

  it('refuses a site without a recorded scan body with a 400 naming the site', async () => {
    const file = await freshScanFile();
    const site = await ctx.http
      .post(`/api/patients/${t.ids.wendell}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi: 17 });
    expect(site.status, JSON.stringify(site.body)).toBe(201);
    const res = await mark('dentist', file, { siteId: site.body.id, point: { x: 0, y: 0, z: 0 } });
    expect(res.status).toBe(400);
    expect(res.body.fields.siteId).toBe(
      'No scan body is recorded at site 17 in this impression: record it with the impression before marking it on the scan',
    );
    const elsewhere = await mark('dentist', file, { siteId: t.ids.harold35, point: { x: 0, y: 0, z: 0 } });
    expect(elsewhere.status).toBe(400);
    expect(elsewhere.body.fields.siteId).toBe("Not one of this patient's sites");
  });

  it('refuses coordinates that are not finite numbers, or far outside any scan, with a 400 at the field', async () => {
    const file = await freshScanFile();
    // JSON has no Infinity: 1e999 is how a client would send one (JSON.parse reads it as Infinity).
    const infinite = await ctx.http
      .post(`/api/scan-files/${file}/markers`)
      .set('Cookie', cookies.dentist)
      .set('Content-Type', 'application/json')
      .send(`{"siteId":"${t.ids.wendell15}","point":{"x":1e999,"y":0,"z":0}}`);
    expect(infinite.status).toBe(400);
    expect(infinite.body.fields['point.x']).toBe('Give each coordinate as a finite number');
    const text = await mark('dentist', file, { siteId: t.ids.wendell15, point: { x: 0, y: 'NaN', z: 0 } });
    expect(text.status).toBe(400);
    expect(text.body.fields['point.y']).toBe('Give each coordinate as a finite number');
    const far = await mark('dentist', file, { siteId: t.ids.wendell15, point: { x: 0, y: 0, z: -5000 } });
    expect(far.status).toBe(400);
    expect(far.body.fields['point.z']).toMatch(/far outside any scan/);
    expect((await markers('dentist', file)).body.items).toEqual([]);
  });

  it('another practice gets 404, the hygienist may read but not place, the surgeon neither', async () => {
    const file = await freshScanFile();
    const body = { siteId: t.ids.wendell15, point: { x: 1, y: 1, z: 1 } };
    expect((await mark('otherPracticeDentist', file, body)).status).toBe(404);
    expect((await markers('otherPracticeDentist', file)).status).toBe(404);
    expect((await mark('hygienist', file, body)).status).toBe(403);
    expect((await markers('surgeon', file)).status).toBe(403);
    expect((await markers('dentist', file)).body.items).toEqual([]);
  });

  it('the database keeps the chain: one version per marker, a whole point or none', async () => {
    const file = await freshScanFile();
    const first = await mark('dentist', file, { siteId: t.ids.wendell16, point: { x: 1, y: 1, z: 1 } });
    const [row] = await ctx.db.select().from(scanBodyMarkers).where(eq(scanBodyMarkers.id, first.body.id));
    const { id: _id, placedAt: _at, ...copy } = row;
    const refusal = (values: typeof scanBodyMarkers.$inferInsert) =>
      ctx.db
        .insert(scanBodyMarkers)
        .values(values)
        .then(
          () => null,
          (e: { cause?: { code?: string; constraint?: string } }) => e.cause,
        );
    // A second first marker of the file and site, written straight into the table.
    expect(await refusal(copy)).toMatchObject({ code: '23505', constraint: 'scan_body_markers_first_unique' });
    await ctx.db.insert(scanBodyMarkers).values({ ...copy, supersedesId: first.body.id, amendmentReason: 'Direct' });
    // A second version superseding the same one.
    expect(await refusal({ ...copy, supersedesId: first.body.id, amendmentReason: 'Again' })).toMatchObject({
      code: '23505',
      constraint: 'scan_body_markers_supersedes_unique',
    });
    // Part of a point only.
    expect(await refusal({ ...copy, siteId: t.ids.wendell15, z: null })).toMatchObject({
      code: '23514',
      constraint: 'scan_body_markers_point_whole',
    });
  });

  it("the demo: Wendell's scan file has both scan bodies marked on the shapes drawn for them", async () => {
    const [demo] = await ctx.db
      .select({ id: scanFiles.id })
      .from(scanFiles)
      .where(eq(scanFiles.originalName, 'upper-right-15-16.stl'));
    const res = await markers('hygienist', demo.id);
    expect(res.body.items.map((m: { fdi: number; point: object }) => [m.fdi, m.point])).toEqual([
      [15, { x: 4.5, y: 0, z: 16 }],
      [16, { x: -4.5, y: 0, z: 16 }],
    ]);
  });
});
