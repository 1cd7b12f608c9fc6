// The Recall desk's summary (recall_summaries, ADR 0009) follows every write that changes what the
// desk shows, in the write's own transaction: a test per write path that makes the write over HTTP
// and reads the desk after it. After each, every patient's summary row is also compared with the
// same values computed from the sources the slow way (the desk's former per-patient subqueries),
// so a write path that leaves the summary stale fails here, whichever column it would leave behind
// (the CSV's sites text, a generated column, included).
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RecallClock } from '../src/recalls/recall-clock.js';
import { larkspurId, parts, platformId } from './support/ledger-fixtures.js';
import { type AccountKey, patientId, signInAll, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let today: string;
let practiceId: string;
let seq = 0;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  today = ctx.app.get(RecallClock).today();
  practiceId = await larkspurId(ctx.db);
});
afterAll(() => ctx.close());

const day = (daysFromToday: number) =>
  new Date(Date.parse(`${today}T00:00:00Z`) + daysFromToday * 86_400_000).toISOString().slice(0, 10);

interface DeskItem {
  patientId: string;
  chartNumber: string;
  name: string;
  nextDueOn: string | null;
  overdueDays: number;
  lastExamOn: string | null;
  sites: { siteId: string; fdi: number; status: string; lastExamOn: string | null }[];
  provisionalsOverdue?: { restorationId: string; fdis: number[]; plannedReplacementOn: string }[];
}
const desk = async (query: Record<string, string | number>, who: AccountKey = 'hygienist') => {
  const res = await ctx.http
    .get('/api/recalls/desk')
    .query({ pageSize: 200, ...query })
    .set('Cookie', cookies[who]);
  expect(res.status).toBe(200);
  return res.body as { items: DeskItem[]; total: number };
};
/** The patient's desk row found by a search on their (unique) family name, or undefined. */
const rowOf = async (familyName: string, query: Record<string, string | number> = {}) =>
  (await desk({ search: familyName, ...query })).items.find((r) => r.name.endsWith(familyName));

/**
 * Patients whose summary differs from their sources, computed here one patient at a time with the
 * desk's former subqueries (not with recall_summary_refresh): none after any write.
 */
async function staleSummaries(): Promise<unknown[]> {
  const current = (a: string) => `not exists (select 1 from recall_exams ${a}_n where ${a}_n.supersedes_id = ${a}.id)`;
  const { rows } = await ctx.db.execute(
    sql.raw(`
    select pa.id, pa.chart_number, rs.patient_id is null as missing from patients pa
    left join recall_summaries rs on rs.patient_id = pa.id
    where rs.patient_id is null or (rs.practice_id, rs.family_name, rs.given_name, rs.archived, rs.on_desk, rs.next_due,
            rs.last_exam_on, rs.prior_peri_implantitis, rs.peri_implantitis_last, rs.provisional_due, rs.sites::text,
            rs.sites_text)
      is distinct from (pa.practice_id, pa.family_name, pa.given_name, pa.archived_at is not null,
        exists (select 1 from implant_sites s where s.patient_id = pa.id and s.status in ('placed', 'restored')),
        (select min(r.due_on) from recalls r where r.patient_id = pa.id and r.status = 'scheduled'),
        (select max(x.examined_on) from recall_exams x where x.patient_id = pa.id and ${current('x')}),
        exists (select 1 from recall_exams x where x.patient_id = pa.id and x.status = 'peri-implantitis' and ${current('x')}),
        exists (select 1 from implant_sites s cross join lateral (
                  select x.status from recall_exams x where x.site_id = s.id and ${current('x')}
                  order by x.examined_on desc, x.recorded_at desc limit 1) l
                where s.patient_id = pa.id and s.status in ('placed', 'restored') and l.status = 'peri-implantitis'),
        (select min(rp.planned_replacement_on) from restorations rp
          where rp.patient_id = pa.id and rp.provisional and rp.status = 'delivered'),
        coalesce((
          select json_agg(json_build_object('siteId', s.id, 'fdi', s.fdi, 'status', e.status, 'examinedOn', e.examined_on) order by s.fdi)
          from implant_sites s
          left join lateral (
            select x.status, x.examined_on from recall_exams x where x.site_id = s.id and ${current('x')}
            order by x.examined_on desc, x.recorded_at desc limit 1
          ) e on true
          where s.patient_id = pa.id and s.status in ('placed', 'restored')
        ), '[]'::json)::text,
        -- The export's cell (sites_text, migration 0040): each site's latest status by FDI, or not-examined.
        (select coalesce(string_agg(s.fdi || ': ' || coalesce(e.status::text, 'not-examined'), '; ' order by s.fdi), '')
          from implant_sites s
          left join lateral (
            select x.status from recall_exams x where x.site_id = s.id and ${current('x')}
            order by x.examined_on desc, x.recorded_at desc limit 1
          ) e on true
          where s.patient_id = pa.id and s.status in ('placed', 'restored')))`),
  );
  return rows;
}

async function newPatient(over: Record<string, unknown> = {}) {
  seq += 1;
  const familyName = `Summerfield${seq}x${Date.now() % 100_000}`;
  const res = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookies.dentist)
    .send({ givenName: 'Imogen', familyName, birthDate: '1961-05-17', ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.id as string, familyName };
}
async function plannedSite(pid: string, fdi: number) {
  const res = await ctx.http.post(`/api/patients/${pid}/sites`).set('Cookie', cookies.dentist).send({ fdi });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}
async function place(site: string) {
  const res = await ctx.http
    .post(`/api/sites/${site}/placements`)
    .set('Cookie', cookies.dentist)
    .send({
      platformId: await platformId(ctx.db, practiceId, 'Solvra CN 3.5'),
      placedOn: day(-60),
      lengthMm: 10,
      lot: null,
      udi: null,
      insertionTorqueNcm: 35,
      stabilityIsq: 70,
      grafting: null,
      loadingProtocol: 'conventional',
      axis: { x: 0, y: 0, z: 1 },
      closureComponentId: null,
      closureLot: null,
      notes: null,
    });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}
/** A patient with one placed implant at 21, on the desk. */
async function patientOnDesk() {
  const p = await newPatient();
  const site = await plannedSite(p.id, 21);
  await place(site);
  return { ...p, site };
}
const POSITIONS = ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const;
const probing = (depth: number, bleeding: boolean) =>
  POSITIONS.map((position) => ({ position, probingDepthMm: depth, bleeding, suppuration: false }));
const visit = async (pid: string, site: string, examinedOn: string, depth = 3, bleeding = false) => {
  const res = await ctx.http
    .post('/api/recalls/visits')
    .set('Cookie', cookies.hygienist)
    .send({ patientId: pid, examinedOn, exams: [{ siteId: site, sites: probing(depth, bleeding), mobility: false }] });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { exams: { id: string; status: string }[]; nextRecall: { dueOn: string } | null };
};

describe('the desk summary follows every write path', () => {
  it('a new patient, a planned site and a placement: on the desk from the placement, not examined', async () => {
    const p = await newPatient();
    expect(await staleSummaries()).toEqual([]);
    expect(await rowOf(p.familyName)).toBeUndefined();
    const site = await plannedSite(p.id, 11);
    expect(await rowOf(p.familyName)).toBeUndefined();
    expect(await staleSummaries()).toEqual([]);
    await place(site);
    const row = await rowOf(p.familyName);
    expect(row).toMatchObject({ nextDueOn: null, lastExamOn: null, overdueDays: 0 });
    expect(row?.sites).toEqual([{ siteId: site, fdi: 11, status: 'not-examined', lastExamOn: null }]);
    expect(await staleSummaries()).toEqual([]);
  });

  it('an exam recorded: last exam, the implant status and the recall it schedules', async () => {
    const p = await patientOnDesk();
    const recorded = await visit(p.id, p.site, day(-10));
    const row = await rowOf(p.familyName);
    expect(row).toMatchObject({ lastExamOn: day(-10), nextDueOn: recorded.nextRecall?.dueOn });
    expect(row?.sites[0]).toMatchObject({ status: recorded.exams[0].status, lastExamOn: day(-10) });
    // Sorted by last exam, newest first, the patient is among the rows of that day.
    const byExam = await desk({ sort: 'lastExamOn', dir: 'desc', search: p.familyName });
    expect(byExam.items.map((r) => r.lastExamOn)).toEqual([day(-10)]);
    expect(await staleSummaries()).toEqual([]);
  });

  it('an exam amended: the amendment replaces the status, on the peri-implantitis filter and off it again', async () => {
    const p = await patientOnDesk();
    // Baseline, then a deep bleeding pocket: with no baseline bone level the no-baseline definition
    // applies (Berglundh et al. 2018: BOP and PD ≥ 6 mm is peri-implantitis).
    await visit(p.id, p.site, day(-400), 3, false);
    const deep = await visit(p.id, p.site, day(-5), 7, true);
    const onFilter = async () =>
      (await desk({ filter: 'peri-implantitis-last', search: p.familyName })).items.map((r) => r.patientId);
    const status = deep.exams[0].status;
    expect((await rowOf(p.familyName))?.sites[0].status).toBe(status);
    expect(await onFilter()).toEqual(status === 'peri-implantitis' ? [p.id] : []);
    const amended = await ctx.http
      .post(`/api/recalls/exams/${deep.exams[0].id}/amend`)
      .set('Cookie', cookies.hygienist)
      .send({
        sites: probing(3, false),
        mobility: false,
        amendmentReason: 'Probed the neighbouring tooth by mistake.',
      });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect((await rowOf(p.familyName))?.sites[0]).toMatchObject({ status: amended.body.status, lastExamOn: day(-5) });
    expect(await onFilter()).toEqual([]);
    expect(await staleSummaries()).toEqual([]);
  });

  it('a recall coming due and a later exam: overdue, then rescheduled off the overdue filter', async () => {
    const p = await patientOnDesk();
    // An exam two years ago schedules a recall long past: overdue today.
    const old = await visit(p.id, p.site, day(-730));
    const due = old.nextRecall?.dueOn ?? '';
    expect(due < today).toBe(true);
    const overdue = await desk({ filter: 'overdue', search: p.familyName });
    expect(overdue.items.map((r) => [r.patientId, r.nextDueOn])).toEqual([[p.id, due]]);
    const fresh = await visit(p.id, p.site, today);
    expect((await desk({ filter: 'overdue', search: p.familyName })).items).toEqual([]);
    expect((await rowOf(p.familyName))?.nextDueOn).toBe(fresh.nextRecall?.dueOn);
    expect(await staleSummaries()).toEqual([]);
  });

  it('a patient renamed: the desk sorts and finds them by the new name', async () => {
    const p = await patientOnDesk();
    const renamed = `${p.familyName}renamed`;
    const res = await ctx.http
      .patch(`/api/patients/${p.id}`)
      .set('Cookie', cookies.dentist)
      .send({ familyName: renamed });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const row = await rowOf(renamed, { sort: 'name' });
    expect(row?.name).toBe(`Imogen ${renamed}`);
    expect(await staleSummaries()).toEqual([]);
  });

  it('a patient archived and brought back: off the active desk, on the archived one, and back', async () => {
    const p = await patientOnDesk();
    const archived = await ctx.http
      .post(`/api/patients/${p.id}/archive`)
      .set('Cookie', cookies.practice_admin)
      .send({ reason: 'Moved away' });
    expect(archived.status).toBe(200);
    expect(await rowOf(p.familyName)).toBeUndefined();
    expect((await rowOf(p.familyName, { archived: 'archived' }))?.patientId).toBe(p.id);
    expect(await staleSummaries()).toEqual([]);
    const back = await ctx.http
      .post(`/api/patients/${p.id}/unarchive`)
      .set('Cookie', cookies.practice_admin)
      .send({ reason: 'Came back' });
    expect(back.status).toBe(200);
    expect((await rowOf(p.familyName))?.patientId).toBe(p.id);
    expect(await staleSummaries()).toEqual([]);
  });

  it('a provisional delivered, then its definitive: on the provisional filter, then off it', async () => {
    const p = await patientOnDesk();
    const part = await parts(ctx.db, practiceId, 'Solvra CN 3.5');
    const crown = {
      patientId: p.id,
      kind: 'single-crown',
      retention: 'screw-to-implant',
      material: 'other',
      sites: [
        {
          siteId: p.site,
          interface: 'engaging',
          impressionCoping: 'engaging',
          screwComponentIds: [part('PSI')],
          impressionCopingComponentId: part('ICE-C'),
        },
      ],
    };
    const deliver = (id: string, deliveredOn: string, lot: string) =>
      ctx.http
        .post(`/api/restorations/${id}/delivery`)
        .set('Cookie', cookies.dentist)
        .send({ deliveredOn, parts: [{ siteId: p.site, componentId: part('PSI'), lot }] });
    const onFilter = async () =>
      (await desk({ filter: 'provisional-overdue', search: p.familyName })).items.map((r) => r.patientId);
    const provisional = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send({ ...crown, provisional: true, plannedReplacementOn: day(-2) });
    expect(provisional.status, JSON.stringify(provisional.body)).toBe(201);
    expect(await onFilter()).toEqual([]); // planned, not delivered
    expect((await deliver(provisional.body.id, day(-40), 'PSI-S1')).status).toBe(200);
    expect(await onFilter()).toEqual([p.id]);
    expect((await rowOf(p.familyName))?.sites[0].fdi).toBe(21);
    expect(await staleSummaries()).toEqual([]);
    const definitive = await ctx.http.post('/api/restorations').set('Cookie', cookies.dentist).send(crown);
    expect(definitive.status, JSON.stringify(definitive.body)).toBe(201);
    expect((await deliver(definitive.body.id, today, 'PSI-S2')).status).toBe(200);
    expect(await onFilter()).toEqual([]);
    expect(await staleSummaries()).toEqual([]);
  });

  it('keeps one practice to itself: another practice never sees the new rows, on the page or in the count', async () => {
    const p = await patientOnDesk();
    const other = await desk({ search: p.familyName }, 'otherPracticeDentist');
    expect(other).toMatchObject({ items: [], total: 0 });
    expect((await desk({ search: p.familyName })).total).toBe(1);
  });

  it('the seeded practice: every patient has a summary equal to its sources', async () => {
    expect(await staleSummaries()).toEqual([]);
    const whitcombe = await patientId(ctx.db, 'LL-1001');
    const count = await ctx.db.execute<{ n: number }>(
      sql`select count(*)::int as n from recall_summaries where patient_id = ${whitcombe}`,
    );
    expect(count.rows[0].n).toBe(1);
  });
});
