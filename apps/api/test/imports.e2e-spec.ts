// Legacy CSV import (issue 14, docs/import.md): the dry run of a file with good and bad rows,
// the real import, its idempotence, a failure in the middle of the writes, Windows-1252 and the
// bad-input cases. Each test brings its own chart numbers, so the order does not matter.
import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import iconv from 'iconv-lite';
import pg from 'pg';
import { and, eq, inArray } from 'drizzle-orm';
import type { ImportReport, ImportResult, TimelineReply } from '@torquetrail/contracts';
import { RULES_VERSION } from '@torquetrail/domain';
import { afterAll, describe, expect, it } from 'vitest';
import { implantSites, patients, recallExams, restorationSites, torqueEvents } from '../src/db/schema/index.js';
import { csvText, type ImportCells, patientCells, rowCounts, sendImport } from './support/import-files.js';
import { ownerDatabaseUrl, patientId, signInAll, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);
const [harold] = await ctx.db
  .select()
  .from(patients)
  .where(eq(patients.id, await patientId(ctx.db, 'LL-1001')));

const example = readFileSync(new URL('../../web/public/import/torquetrail-import-example.csv', import.meta.url));

/** A new patient (named after the chart) with a placed, delivered implant, a screw at 25 N·cm, an exam. */
function goodRows(chart: string, family = 'Quenby', given = `Alvar ${chart}`): ImportCells[] {
  const p = patientCells(chart, family, given, '1958-09-30', 46);
  return [
    { event: 'placement', ...p, date: '2013-05-06', system: 'Solvra CN', platform: 'Solvra CN 5.0', length_mm: '8' },
    {
      event: 'delivery',
      ...p,
      date: '2013-09-12',
      restoration_kind: 'single-crown',
      retention: 'screw-to-implant',
      material: 'zirconia',
    },
    { event: 'part', ...p, date: '2013-09-12', part_ref: 'SCN-50-PSI', lot: 'LOT-77' },
    { event: 'torque', ...p, date: '2013-09-12', part_ref: 'SCN-50-PSI', torque_ncm: '25' },
    {
      event: 'exam',
      ...p,
      date: '2014-09-20',
      pd_mb: '3',
      pd_b: '3',
      pd_db: '3',
      pd_ml: '3',
      pd_l: '3',
      pd_dl: '3',
      bop: 'none',
      bone_level_mm: '1',
    },
  ];
}

const byFirst = (a: unknown[], b: unknown[]) => String(a[0]).localeCompare(String(b[0]));

const siteOf = async (chart: string, fdi: number) => {
  const [row] = await ctx.db
    .select({ id: implantSites.id, status: implantSites.status })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(patients.chartNumber, chart), eq(implantSites.fdi, fdi)));
  return row;
};

describe('dry run', () => {
  it('reports every bad row with its column and writes nothing', async () => {
    const chart = `DRY-${randomUUID().slice(0, 6)}`;
    const good = goodRows(chart);
    const p = patientCells(chart, 'Quenby', `Alvar ${chart}`, '1958-09-30', 46);
    const rows: ImportCells[] = [
      ...good, // rows 2–6
      { ...good[4], fdi: '19' }, // 7: no such tooth
      { ...good[4], date: '2019-02-30' }, // 8: impossible date
      { ...good[3], torque_ncm: '150' }, // 9: torque out of range
      { event: 'part', ...p, date: '2013-09-12', part_ref: 'XX-OLD-9', part_name: 'Old screw', lot: 'A1' }, // 10
      { ...good[4], notes: '=HYPERLINK("http://x.example")' }, // 11: formula cell
      // 12: Harold's chart number with his record's name and birth date: matched (warning)
      {
        event: 'placement',
        ...patientCells('LL-1001', harold.familyName, harold.givenName, harold.birthDate, 18),
        date: '2015-01-10',
        system: 'Solvra CN',
        platform: 'Solvra CN 4.3',
        length_mm: '10',
      },
      // 13: Harold's chart number under another name: refused
      { ...good[0], ...patientCells('LL-1001', 'Other', 'Person', '1990-01-01', 17) },
      { ...good[3], torque_ncm: '12' }, // 14: a low torque is judged, not refused
      { ...good[0], ...patientCells(`${chart}-B`, 'Zed', 'Ann', '1970-01-01', 26), platform: 'Nowhere 9' }, // 15
    ];
    const before = await rowCounts(ctx);
    const res = await sendImport(ctx, cookies.practice_admin, csvText(rows), { dryRun: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const report = res.body as ImportReport;
    expect(report.encoding).toBe('utf-8');
    expect(report.delimiter).toBe(',');
    expect(report.counts).toMatchObject({ rows: 14, patientsNew: 1, patientsMatched: 1, placement: 2, torque: 2 });
    const errors = report.issues.filter((i) => i.level === 'error').map((i) => [i.row, i.column, i.message]);
    expect(errors).toEqual([
      [7, 'fdi', expect.stringMatching(/19 is not an FDI/)],
      [8, 'date', expect.stringMatching(/2019-02-30 is not a date that exists/)],
      [9, 'torque_ncm', expect.stringMatching(/between 1 and 100/)],
      [10, 'part_ref', expect.stringMatching(/XX-OLD-9 is not in the practice catalogue/)],
      [11, 'notes', expect.stringMatching(/spreadsheet formula/)],
      [13, 'chart_number', expect.stringMatching(/LL-1001 has another name or birth date on row 12/)],
      [15, 'platform', expect.stringMatching(/not a platform of the practice catalogue/)],
    ]);
    expect(report.errors).toBe(7);
    expect(report.issues.filter((i) => i.level === 'warning')).toEqual([
      expect.objectContaining({
        row: 12,
        column: 'chart_number',
        message: expect.stringMatching(/Matches the existing/),
      }),
    ]);
    expect(report.unknownParts).toEqual([{ partRef: 'XX-OLD-9', partName: 'Old screw', rows: [10] }]);
    expect(report.catalogueParts.some((c) => c.referenceCode === 'SCN-50-PSI')).toBe(true);
    expect(report.alreadyImportedAt).toBeNull();
    expect(await rowCounts(ctx)).toEqual(before);
    // The same file is refused by the real import: nothing is written.
    const refused = await sendImport(ctx, cookies.practice_admin, csvText(rows));
    expect(refused.status).toBe(422);
    expect(refused.body.message).toMatch(/7 problem\(s\) stop this import/);
    expect(await rowCounts(ctx)).toEqual(before);
  });

  it('matches a patient by name and birth date under another chart number (warning)', async () => {
    const rows = goodRows('NEW-CHART-1', harold.familyName, harold.givenName).map((r) => ({
      ...r,
      birth_date: harold.birthDate,
    }));
    const report = (await sendImport(ctx, cookies.dentist, csvText(rows), { dryRun: true })).body as ImportReport;
    expect(report.counts).toMatchObject({ patientsNew: 0, patientsMatched: 1 });
    expect(report.issues).toEqual([
      expect.objectContaining({ level: 'warning', message: expect.stringMatching(/Same name and birth date/) }),
    ]);
  });
});

describe('import', () => {
  it('writes the example file once, marked in the Timeline, verdicts and statuses recomputed', async () => {
    const before = await rowCounts(ctx);
    const res = await sendImport(ctx, cookies.practice_admin, example, { fileName: 'example.csv' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const result = res.body as ImportResult;
    // A bridge's delivery rows count as one delivery: one restoration (LEG-0003's 45–46).
    expect(result).toMatchObject({
      written: true,
      counts: { rows: 19, patientsNew: 3, sites: 4, placement: 4, delivery: 3, part: 5, torque: 3, exam: 3 },
    });
    const after = await rowCounts(ctx);
    expect(after.patients - before.patients).toBe(3);
    expect(after.torque_events - before.torque_events).toBe(3);
    expect(after.recall_exams - before.recall_exams).toBe(3);
    expect(after.recall_exam_sites - before.recall_exam_sites).toBe(18);
    expect(after.legacy_imports - before.legacy_imports).toBe(1);

    const site = await siteOf('LEG-0001', 36);
    expect(site.status).toBe('restored');
    // The example's two-unit bridge (two delivery rows, one restoration_ref) is one restoration.
    const bridge = await ctx.db
      .select({ restorationId: restorationSites.restorationId })
      .from(restorationSites)
      .where(inArray(restorationSites.siteId, [(await siteOf('LEG-0003', 45)).id, (await siteOf('LEG-0003', 46)).id]));
    expect(bridge).toHaveLength(2);
    expect(new Set(bridge.map((b) => b.restorationId)).size).toBe(1);
    const torque = await ctx.db
      .select()
      .from(torqueEvents)
      .where(eq(torqueEvents.patientId, await patientId(ctx.db, 'LEG-0001')));
    // 25 and 24.5 N·cm against the catalogue's 25 N·cm ±10 %: within, with the current rules.
    expect(torque.map((t) => [t.appliedNcm, t.verdict, t.rulesVersion]).sort(byFirst)).toEqual([
      [24.5, 'within', RULES_VERSION],
      [25, 'within', RULES_VERSION],
    ]);
    const exams = await ctx.db.select().from(recallExams).where(eq(recallExams.siteId, site.id));
    expect(exams.map((e) => [e.examinedOn, e.status, e.rulesVersion]).sort(byFirst)).toEqual([
      ['2015-07-10', 'health', RULES_VERSION],
      ['2016-07-14', 'mucositis', RULES_VERSION],
    ]);

    const timeline = (await ctx.http.get(`/api/sites/${site.id}/timeline`).set('Cookie', cookies.dentist))
      .body as TimelineReply;
    const marked = timeline.events.map((e) => [e.kind, e.importedFrom]);
    expect(marked).toEqual(
      expect.arrayContaining([
        ['placement', 'example.csv, row 2'],
        ['delivery', 'example.csv, row 3'],
        ['part', 'example.csv, row 4'],
        ['torque', 'example.csv, row 5'],
        ['torque', 'example.csv, row 6'],
        ['recall-exam', 'example.csv, row 7'],
        ['recall-exam', 'example.csv, row 8'],
      ]),
    );

    // The same file again changes nothing and answers with the first import.
    const again = await sendImport(ctx, cookies.dentist, example, { fileName: 'renamed.csv' });
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({ written: false, importId: result.importId, fileName: 'example.csv' });
    expect(await rowCounts(ctx)).toEqual(after);
    const dry = (await sendImport(ctx, cookies.dentist, example, { dryRun: true })).body as ImportReport;
    expect(dry.alreadyImportedAt).toBe(result.importedAt);
  });

  it('a failure in the middle of the writes leaves nothing', async () => {
    const chart = `MID-${randomUUID().slice(0, 6)}`;
    const rows = [...goodRows(chart), ...goodRows(`${chart}-2`, 'Varo', 'Ines')];
    // The database refuses the second patient's torque entry (33.3 N·cm), after the first
    // patient's records are written in the same transaction.
    rows[8].torque_ncm = '33.3';
    const owner = new pg.Client({ connectionString: ownerDatabaseUrl() });
    await owner.connect();
    const trigger = `fail_import_${randomUUID().replace(/-/g, '')}`;
    try {
      await owner.query(`create function ${trigger}() returns trigger language plpgsql as $$
        begin if new.applied_ncm = 33.3 then raise exception 'injected failure'; end if; return new; end $$`);
      await owner.query(
        `create trigger ${trigger} before insert on torque_events for each row execute function ${trigger}()`,
      );
      const before = await rowCounts(ctx);
      const res = await sendImport(ctx, cookies.practice_admin, csvText(rows));
      expect(res.status).toBe(500);
      expect(await rowCounts(ctx)).toEqual(before);
    } finally {
      await owner.query(`drop trigger if exists ${trigger} on torque_events`);
      await owner.query(`drop function if exists ${trigger}()`);
      await owner.end();
    }
    // Without the fault the same file imports.
    expect((await sendImport(ctx, cookies.practice_admin, csvText(rows))).status).toBe(201);
  });

  it('reads a Windows-1252 file with ; and decimal commas', async () => {
    const chart = `WIN-${randomUUID().slice(0, 6)}`;
    const rows = goodRows(chart, 'Müller-Lüdenscheidt', 'Zoë').map((r) =>
      r.event === 'placement' ? { ...r, length_mm: '8,5' } : r,
    );
    const bytes = iconv.encode(csvText(rows, ';'), 'win1252');
    expect(bytes.includes(Buffer.from('ü', 'utf8'))).toBe(false);
    const dry = (await sendImport(ctx, cookies.dentist, bytes, { dryRun: true })).body as ImportReport;
    expect(dry).toMatchObject({ encoding: 'windows-1252', delimiter: ';', errors: 0 });
    expect((await sendImport(ctx, cookies.dentist, bytes)).status).toBe(201);
    const [p] = await ctx.db.select().from(patients).where(eq(patients.chartNumber, chart));
    expect([p.familyName, p.givenName]).toEqual(['Müller-Lüdenscheidt', 'Zoë']);
  });

  it('maps an unknown part to a catalogue part, or keeps it as free text', async () => {
    const chart = `MAP-${randomUUID().slice(0, 6)}`;
    const p = patientCells(chart, 'Ostrander', 'Bea', '1958-09-30', 46);
    const rows = goodRows(chart, 'Ostrander', 'Bea').map((r) =>
      r.part_ref === 'SCN-50-PSI' ? { ...r, part_ref: 'OLD-PS-50' } : r,
    );
    rows.push({ event: 'part', ...p, date: '2013-09-12', part_ref: 'HEAL-X', part_name: 'Healing cap (old brand)' });
    const dry = (await sendImport(ctx, cookies.dentist, csvText(rows), { dryRun: true })).body as ImportReport;
    expect(dry.unknownParts.map((u) => u.partRef)).toEqual(['OLD-PS-50', 'HEAL-X']);
    const psi = dry.catalogueParts.find((c) => c.referenceCode === 'SCN-50-PSI')!;
    const mappings = [
      { partRef: 'OLD-PS-50', componentId: psi.id },
      { partRef: 'HEAL-X', freeText: true },
    ];
    const res = await sendImport(ctx, cookies.dentist, csvText(rows), { mappings });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const site = await siteOf(chart, 46);
    const timeline = (await ctx.http.get(`/api/sites/${site.id}/timeline`).set('Cookie', cookies.dentist))
      .body as TimelineReply;
    expect(timeline.events.find((e) => e.kind === 'imported-part')).toMatchObject({
      title: 'Part not in the catalogue: Healing cap (old brand)',
      importedFrom: 'history.csv, row 7',
    });
    expect(timeline.events.find((e) => e.kind === 'torque')).toMatchObject({ verdict: 'within' });
  });
});

describe('bad input: a readable answer and nothing written', () => {
  it('missing columns, UTF-16, an empty file, an unreadable quote, a JSON body', async () => {
    const before = await rowCounts(ctx);
    const missing = await sendImport(ctx, cookies.dentist, 'event,chart_number,fdi,date\r\n', { dryRun: true });
    expect(missing.status).toBe(400);
    expect(missing.body.message).toMatch(/lacks required column\(s\): family_name, given_name, birth_date/);
    const utf16 = await sendImport(ctx, cookies.dentist, Buffer.from(csvText(goodRows('U16')), 'utf16le'));
    expect(utf16.status).toBe(400);
    expect(utf16.body.message).toMatch(/UTF-16/);
    expect((await sendImport(ctx, cookies.dentist, Buffer.alloc(0))).body.message).toMatch(/empty/);
    const quote = await sendImport(ctx, cookies.dentist, `${csvText([])}placement,"LL-1,x\r\n`, { dryRun: true });
    expect(quote.status).toBe(400);
    expect(quote.body.message).toMatch(/could not be read as CSV/);
    const json = await ctx.http
      .post(`/api/imports?fileName=a.csv&runId=${randomUUID()}`)
      .set('Cookie', cookies.dentist)
      .send({ rows: [] });
    expect(json.status).toBe(415);
    expect(await rowCounts(ctx)).toEqual(before);
  });

  it('the hygienist and the surgeon may not import; progress is the starter’s own', async () => {
    for (const who of ['hygienist', 'surgeon'] as const)
      expect((await sendImport(ctx, cookies[who], example, { dryRun: true })).status).toBe(403);
    const runId = randomUUID();
    await sendImport(ctx, cookies.dentist, csvText(goodRows('PRG-1')), { dryRun: true, runId });
    const mine = await ctx.http.get(`/api/imports/progress/${runId}`).set('Cookie', cookies.dentist);
    expect(mine.body).toMatchObject({ runId, phase: 'done', rowsRead: 5, totalRows: 5 });
    expect((await ctx.http.get(`/api/imports/progress/${runId}`).set('Cookie', cookies.practice_admin)).status).toBe(
      404,
    );
  });
});
