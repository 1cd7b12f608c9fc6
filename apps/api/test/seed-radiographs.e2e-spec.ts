// The demo seed's radiographs (issue 10): every demo patient has some, DICOM and PNG, stored in
// the S3 fake and served by the API like uploaded ones; the bone levels measured on them agree with
// the seeded recall exams (Desmond's loss shows, Harold's is stable); one delivery's seating is
// confirmed.
import { and, asc, eq, isNotNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patients, radiographMeasurements, radiographs, recallExams } from '../src/db/schema/index.js';
import { actorCookies } from './support/role-matrix.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
});
afterAll(() => ctx.close());

/** The worse of mesial and distal per site and day, as measured on the seeded radiographs. */
async function measuredBone(chart: string) {
  const rows = await ctx.db
    .select({
      siteId: radiographMeasurements.siteId,
      on: radiographs.takenOn,
      mesial: radiographMeasurements.mesialMm,
      distal: radiographMeasurements.distalMm,
    })
    .from(radiographMeasurements)
    .innerJoin(radiographs, eq(radiographs.id, radiographMeasurements.radiographId))
    .where(eq(radiographMeasurements.patientId, await patientId(ctx.db, chart)))
    .orderBy(asc(radiographs.takenOn));
  return rows.map((r) => ({ siteId: r.siteId, on: r.on, worse: Math.max(r.mesial, r.distal) }));
}

describe('seeded radiographs', () => {
  it('every demo patient has radiographs, DICOM and PNG, whose files the API serves', async () => {
    const all = await ctx.db
      .select({ id: radiographs.id, chart: patients.chartNumber, fileType: radiographs.fileType })
      .from(radiographs)
      .innerJoin(patients, eq(patients.id, radiographs.patientId));
    const charts = (await ctx.db.select({ chart: patients.chartNumber }).from(patients)).map((p) => p.chart);
    for (const chart of charts)
      expect(
        all.some((r) => r.chart === chart),
        chart,
      ).toBe(true);
    expect(new Set(all.map((r) => r.fileType))).toEqual(new Set(['dicom', 'png']));

    const dicom = all.find((r) => r.chart === 'LL-1003' && r.fileType === 'dicom')!;
    const detail = await ctx.http.get(`/api/radiographs/${dicom.id}`).set('Cookie', cookies.dentist);
    expect(detail.status).toBe(200);
    expect(detail.body).toMatchObject({ pixelSpacing: [0.1, 0.1], modality: 'IO', previewProblem: null });
    expect(detail.body.measurements[0].spacingEstimate).toMatchObject({ flagged: false });
    for (const which of ['original', 'preview', 'thumbnail']) {
      const res = await ctx.http.get(`/api/radiographs/${dicom.id}/${which}`).set('Cookie', cookies.dentist);
      expect(res.status, which).toBe(200);
    }
  });

  it('measures every exam bone level on a radiograph of that day: the worse side is the exam value', async () => {
    const exams = await ctx.db
      .select({ chart: patients.chartNumber, siteId: recallExams.siteId, on: recallExams.examinedOn })
      .from(recallExams)
      .innerJoin(patients, eq(patients.id, recallExams.patientId))
      .where(and(isNotNull(recallExams.boneLevelMm)));
    const bone = await ctx.db
      .select({ siteId: recallExams.siteId, on: recallExams.examinedOn, mm: recallExams.boneLevelMm })
      .from(recallExams)
      .where(isNotNull(recallExams.boneLevelMm));
    expect(exams.length).toBeGreaterThan(20);
    const byChart = new Map<string, Awaited<ReturnType<typeof measuredBone>>>();
    for (const e of exams) {
      if (!byChart.has(e.chart)) byChart.set(e.chart, await measuredBone(e.chart));
      const m = byChart.get(e.chart)!.filter((x) => x.siteId === e.siteId && x.on === e.on);
      expect(m, `${e.chart} ${e.on}`).toHaveLength(1);
      const expected = bone.find((b) => b.siteId === e.siteId && b.on === e.on)!.mm!;
      expect(m[0].worse).toBeCloseTo(expected, 9);
    }
  });

  it("shows Desmond's bone loss and Harold's stable bone", async () => {
    const desmond = (await measuredBone('LL-1003')).map((m) => m.worse);
    expect(desmond[desmond.length - 1] - desmond[0]).toBeGreaterThanOrEqual(2.5);
    const h35 = await siteId(ctx.db, 'LL-1001', 35);
    const harold = (await measuredBone('LL-1001')).filter((m) => m.siteId === h35).map((m) => m.worse);
    expect(harold.length).toBeGreaterThanOrEqual(5);
    expect(Math.max(...harold) - Math.min(...harold)).toBeLessThanOrEqual(0.5);
  });

  it("confirms the seating of Lucía's crown on the radiograph of its delivery day", async () => {
    const site = await siteId(ctx.db, 'LL-1004', 14);
    const file = await ctx.http.get(`/api/sites/${site}`).set('Cookie', cookies.dentist);
    expect(file.body.restoration).toMatchObject({
      deliveredOn: '2020-03-09',
      seating: { seated: 'yes', radiographTakenOn: '2020-03-09', radiographEnteredInError: false },
    });
    const timeline = await ctx.http.get(`/api/sites/${site}/timeline`).set('Cookie', cookies.hygienist);
    const kinds = timeline.body.events.filter((e: { at: string }) => e.at.startsWith('2020-03-09'));
    expect(kinds.map((e: { kind: string }) => e.kind)).toEqual(
      expect.arrayContaining(['delivery', 'radiograph', 'seating-check']),
    );
  });
});
