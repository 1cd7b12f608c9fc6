// Legacy import (docs/import.md, "Bridges" and "What each event writes"): the delivery rows of one
// bridge become one restoration spanning its sites, and imported exams schedule the next recall
// by the same rule (nextRecallDate) as an exam entered in the app.
import { and, eq } from 'drizzle-orm';
import type { ImportReport } from '@torquetrail/contracts';
import { nextRecallDate } from '@torquetrail/domain';
import { afterAll, describe, expect, it } from 'vitest';
import { implantSites, patients, recalls, restorationSites, restorations } from '../src/db/schema/index.js';
import { csvText, type ImportCells, patientCells, sendImport } from './support/import-files.js';
import { signInAll, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);
/** The practice's recall policy, as the exam form's rescheduling reads it. */
const policy = (await ctx.http.get('/api/recalls/policy').set('Cookie', cookies.dentist)).body as {
  baseMonths: number;
  riskMonths: number;
};
const noRisk = { smoker: false, diabetesPoorlyControlled: false, periodontitisHistory: false };

const placement = (p: ImportCells, date: string): ImportCells => ({
  event: 'placement',
  ...p,
  date,
  system: 'Solvra CN',
  platform: 'Solvra CN 4.3',
  length_mm: '10',
});
const delivery = (p: ImportCells, date: string, kind: string, more: ImportCells = {}): ImportCells => ({
  event: 'delivery',
  ...p,
  date,
  restoration_kind: kind,
  retention: 'screw-to-multi-unit',
  material: 'titanium-porcelain',
  ...more,
});
const exam = (p: ImportCells, date: string, depth: string, bop = 'none'): ImportCells => ({
  event: 'exam',
  ...p,
  date,
  pd_mb: depth,
  pd_b: depth,
  pd_db: depth,
  pd_ml: depth,
  pd_l: depth,
  pd_dl: depth,
  bop,
  bone_level_mm: '1',
});

async function restorationsOf(chart: string) {
  const [patient] = await ctx.db.select().from(patients).where(eq(patients.chartNumber, chart));
  const rows = await ctx.db
    .select({ id: restorations.id, kind: restorations.kind, fdi: implantSites.fdi, status: implantSites.status })
    .from(restorations)
    .innerJoin(restorationSites, eq(restorationSites.restorationId, restorations.id))
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .where(eq(restorations.patientId, patient.id));
  const byId = new Map<string, { kind: string; fdis: number[]; statuses: string[] }>();
  for (const r of rows) {
    const entry = byId.get(r.id) ?? { kind: r.kind, fdis: [], statuses: [] };
    entry.fdis.push(r.fdi);
    entry.statuses.push(r.status);
    byId.set(r.id, entry);
  }
  return [...byId.values()].map((r) => ({ ...r, fdis: r.fdis.sort((a, b) => a - b) }));
}

describe('an imported bridge', () => {
  it('is one restoration spanning its sites; another ref or a crown is a restoration of its own', async () => {
    const chart = 'BRG-0001';
    const at = (fdi: number) => patientCells(chart, 'Thornbury', 'Elsa', '1955-02-14', fdi);
    const rows: ImportCells[] = [
      ...[14, 15, 16, 24, 26, 36].map((fdi) => placement(at(fdi), '2015-03-02')),
      // One bridge on 14–16 (no ref), one on 24–26 with a ref of its own, a crown on 36: same day.
      ...[14, 15, 16].map((fdi) => delivery(at(fdi), '2015-08-10', 'splinted-bridge')),
      ...[24, 26].map((fdi) => delivery(at(fdi), '2015-08-10', 'splinted-bridge', { restoration_ref: 'upper-left' })),
      delivery(at(36), '2015-08-10', 'single-crown', { retention: 'screw-to-implant', material: 'zirconia' }),
    ];
    const dry = await sendImport(ctx, cookies.dentist, csvText(rows), { dryRun: true, fileName: 'bridges.csv' });
    expect(dry.status).toBe(200);
    const report = dry.body as ImportReport;
    expect(report.issues.filter((i) => i.level === 'error')).toEqual([]);
    // Three restorations from six delivery rows.
    expect(report.counts).toMatchObject({ rows: 12, placement: 6, delivery: 3 });

    const run = await sendImport(ctx, cookies.dentist, csvText(rows), { fileName: 'bridges.csv' });
    expect(run.status).toBe(201);
    const written = await restorationsOf(chart);
    expect(written.map((r) => [r.kind, r.fdis]).sort((a, b) => String(a[1]).localeCompare(String(b[1])))).toEqual([
      ['splinted-bridge', [14, 15, 16]],
      ['splinted-bridge', [24, 26]],
      ['single-crown', [36]],
    ]);
    expect(new Set(written.flatMap((r) => r.statuses))).toEqual(new Set(['restored']));
  });

  it('refuses a row that joins a bridge with another retention (an error on that row)', async () => {
    const chart = 'BRG-0002';
    const at = (fdi: number) => patientCells(chart, 'Thornbury', 'Piet', '1950-06-01', fdi);
    const rows: ImportCells[] = [
      placement(at(34), '2016-01-05'),
      placement(at(36), '2016-01-05'),
      delivery(at(34), '2016-06-01', 'splinted-bridge'),
      delivery(at(36), '2016-06-01', 'splinted-bridge', { retention: 'cement-on-abutment' }),
    ];
    const dry = await sendImport(ctx, cookies.dentist, csvText(rows), { dryRun: true });
    const errors = (dry.body as ImportReport).issues.filter((i) => i.level === 'error');
    expect(errors).toEqual([expect.objectContaining({ row: 5, column: 'retention' })]);
    expect(errors[0].message).toContain('restoration_ref');
  });
});

describe('imported recall exams', () => {
  it('schedule the next recall from the latest exam, as an exam entered in the app does', async () => {
    const chart = 'RCL-0001';
    const p = patientCells(chart, 'Marlowe', 'Ansel', '1962-11-23', 46);
    const rows: ImportCells[] = [
      placement(p, '2018-04-10'),
      delivery(p, '2018-09-01', 'single-crown', { retention: 'screw-to-implant', material: 'zirconia' }),
      exam(p, '2019-09-03', '3'),
      exam(p, '2020-09-14', '3'),
    ];
    const run = await sendImport(ctx, cookies.dentist, csvText(rows), { fileName: 'recall-history.csv' });
    expect(run.status).toBe(201);
    const [patient] = await ctx.db.select().from(patients).where(eq(patients.chartNumber, chart));
    const scheduled = await ctx.db
      .select()
      .from(recalls)
      .where(and(eq(recalls.patientId, patient.id), eq(recalls.status, 'scheduled')));
    // No risk factor, no peri-implantitis: the practice's usual interval from the last exam.
    const expected = nextRecallDate('2020-09-14', { ...noRisk, priorPeriImplantitis: false }, policy);
    expect(scheduled.map((r) => r.dueOn)).toEqual([expected]);
  });

  it('peri-implantitis in an imported exam gives the shorter risk interval', async () => {
    const chart = 'RCL-0002';
    const p = patientCells(chart, 'Marlowe', 'Bettina', '1960-03-08', 36);
    const rows: ImportCells[] = [
      placement(p, '2017-02-01'),
      delivery(p, '2017-06-01', 'single-crown', { retention: 'screw-to-implant', material: 'zirconia' }),
      { ...exam(p, '2017-07-01', '3'), bone_level_mm: '0.5' },
      { ...exam(p, '2021-05-20', '7', 'all'), bone_level_mm: '4' },
    ];
    const run = await sendImport(ctx, cookies.dentist, csvText(rows), { fileName: 'risk-history.csv' });
    expect(run.status).toBe(201);
    const [patient] = await ctx.db.select().from(patients).where(eq(patients.chartNumber, chart));
    const [due] = await ctx.db
      .select()
      .from(recalls)
      .where(and(eq(recalls.patientId, patient.id), eq(recalls.status, 'scheduled')));
    expect(due.dueOn).toBe(nextRecallDate('2021-05-20', { ...noRisk, priorPeriImplantitis: true }, policy));
    expect(policy.riskMonths).toBeLessThan(policy.baseMonths);
  });
});
