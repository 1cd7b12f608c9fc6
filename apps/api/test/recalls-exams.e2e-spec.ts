// Recall exams over HTTP: who may do what (role matrix), the server-side classification
// (classifyPeriImplant, 2017 World Workshop case definitions — Berglundh et al. 2018 consensus
// report), the scheduling of the next recall (nextRecallDate; Herrera et al. 2023 EFP S3
// guideline for risk-based intervals), bad input, and the seeded history on the Arch and Site file.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextRecallDate } from '@torquetrail/domain';
import { recallExams, recalls } from '../src/db/schema/index.js';
import { RecallClock } from '../src/recalls/recall-clock.js';
import {
  actorCookies,
  all,
  describeRoleMatrix,
  otherPracticeRead,
  type RoleCase,
  sharedRead,
  unsharedRead,
} from './support/role-matrix.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let today: string;

const POSITIONS = ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const;
const sites = (depths: number[], bop: number[] = []) =>
  POSITIONS.map((position, i) => ({
    position,
    probingDepthMm: depths[i],
    bleeding: bop.includes(i),
    suppuration: false,
  }));
const healthyExam = (site: string) => ({
  siteId: site,
  sites: sites([3, 3, 3, 3, 3, 3]),
  mobility: false,
  plaqueIndex: 0,
  bleedingIndex: 0,
});

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  today = ctx.app.get(RecallClock).today();
  ids.whitcombe = await patientId(ctx.db, 'LL-1001');
  ids.okafor = await patientId(ctx.db, 'LL-1003');
  ids.ferraz = await patientId(ctx.db, 'LL-1004');
  ids.wendell = await patientId(ctx.db, 'LL-1005');
  ids.quarry = await patientId(ctx.db, 'QH-2001');
  ids.whitcombe35 = await siteId(ctx.db, 'LL-1001', 35);
  ids.whitcombe37 = await siteId(ctx.db, 'LL-1001', 37);
  ids.okafor46 = await siteId(ctx.db, 'LL-1003', 46);
  ids.ferraz14 = await siteId(ctx.db, 'LL-1004', 14);
  ids.ferraz24 = await siteId(ctx.db, 'LL-1004', 24);
  ids.wendell15 = await siteId(ctx.db, 'LL-1005', 15);
  ids.wendell16 = await siteId(ctx.db, 'LL-1005', 16);
  ids.quarry36 = await siteId(ctx.db, 'QH-2001', 36);
});
afterAll(() => ctx.close());

describe('role matrix of the recall routes', () => {
  const matrix: RoleCase[] = [
    { route: 'GET /api/recalls/desk', path: () => '/api/recalls/desk', expect: all(200) },
    { route: 'GET /api/recalls/desk/csv', path: () => '/api/recalls/desk/csv', expect: all(200) },
    {
      route: 'GET exam-context (shared with the surgeon)',
      path: () => `/api/recalls/patients/${ids.whitcombe}/exam-context`,
      expect: sharedRead(),
    },
    {
      route: 'GET exam-context (not shared)',
      path: () => `/api/recalls/patients/${ids.okafor}/exam-context`,
      expect: unsharedRead(),
    },
    {
      route: 'GET exam-context (another practice)',
      path: () => `/api/recalls/patients/${ids.quarry}/exam-context`,
      expect: otherPracticeRead(),
    },
    {
      route: 'GET site exams (shared)',
      path: () => `/api/recalls/sites/${ids.whitcombe35}/exams`,
      expect: sharedRead(),
    },
    {
      route: 'GET site exams (not shared)',
      path: () => `/api/recalls/sites/${ids.okafor46}/exams`,
      expect: unsharedRead(),
    },
    {
      route: 'GET site exams (another practice)',
      path: () => `/api/recalls/sites/${ids.quarry36}/exams`,
      expect: otherPracticeRead(),
    },
    { route: 'GET site exams (not a uuid)', path: () => '/api/recalls/sites/46/exams', expect: all(404) },
    { route: 'GET /api/recalls/policy', path: () => '/api/recalls/policy', expect: all(200, { surgeon: 403 }) },
    {
      route: 'GET /api/recalls/reminders',
      path: () => '/api/recalls/reminders',
      expect: all(403, { practice_admin: 200 }),
    },
    // The hygienist and the dentist record exams of their practice (another practice's patient is
    // no patient: 404); the guard refuses every other role before the record is looked up.
    {
      route: 'POST /api/recalls/visits',
      method: 'post',
      path: () => '/api/recalls/visits',
      body: () => ({ patientId: ids.ferraz, examinedOn: today, exams: [healthyExam(ids.ferraz14)] }),
      expect: all(403, { hygienist: 201, dentist: 201, otherPracticeDentist: 404 }),
    },
    // Practice admin only. The policy sent is the default one, so no other test sees a change.
    {
      route: 'PUT /api/recalls/policy',
      method: 'put',
      path: () => '/api/recalls/policy',
      body: () => ({ baseMonths: 6, riskMonths: 3, reminderDaysBefore: 14, overdueReminderDaysAfter: 7 }),
      expect: all(403, { practice_admin: 200 }),
    },
    {
      route: 'POST /api/recalls/reminders/run',
      method: 'post',
      path: () => '/api/recalls/reminders/run',
      body: () => ({ today: '2000-01-01' }),
      expect: all(403, { practice_admin: 200 }),
    },
  ];
  describeRoleMatrix(() => ctx, matrix);
});

describe('recording a visit', () => {
  it('classifies each implant on the server, ignoring any status the client sends, and stores the rule version and options (no-baseline definition, Berglundh et al. 2018)', async () => {
    const res = await ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.hygienist)
      .send({
        patientId: ids.wendell,
        examinedOn: today,
        exams: [
          // No baseline (placed seven weeks ago, never examined): BOP with a 6 mm pocket and no radiograph.
          { siteId: ids.wendell15, sites: sites([3, 6, 3, 3, 3, 3], [1]), mobility: false, status: 'health' },
          { ...healthyExam(ids.wendell16), keratinizedMucosaMm: 1.5, notes: 'Healing abutment clean.' },
        ],
      });
    expect(res.status).toBe(201);
    const [e15, e16] = res.body.exams;
    expect(e15).toMatchObject({
      fdi: 15,
      status: 'mucositis',
      baselineExamId: null,
      rulesVersion: expect.any(String),
      ruleOptions: { pdIncreaseMm: 1, boneLossMm: 0.5 },
      examinerName: 'Maren Holt',
    });
    expect(e15.flags).toEqual(
      expect.arrayContaining(['no-baseline', 'bone-level-missing', 'peri-implantitis-not-excluded-without-baseline']),
    );
    expect(e15.sites.map((s: { probingDepthMm: number }) => s.probingDepthMm)).toEqual([3, 6, 3, 3, 3, 3]);
    expect(e16).toMatchObject({
      fdi: 16,
      status: 'health',
      keratinizedMucosaMm: 1.5,
      notes: 'Healing abutment clean.',
    });
    expect(e15.visitId).toBe(e16.visitId);
    // Wendell has no risk factor: the practice's base interval (6 months).
    expect(res.body.nextRecall).toMatchObject({ dueOn: nextRecallDate(today, {}), intervalMonths: 6 });
    const scheduled = await ctx.db.select().from(recalls).where(eq(recalls.patientId, ids.wendell));
    expect(scheduled.filter((r) => r.status === 'scheduled').map((r) => r.dueOn)).toEqual([nextRecallDate(today, {})]);
  });

  /** Desmond Okafor's 46 today: BOP, a deeper pocket than at baseline and bone loss. */
  const desmondVisit = () =>
    ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.hygienist)
      .send({
        patientId: ids.okafor,
        examinedOn: today,
        exams: [{ siteId: ids.okafor46, sites: sites([6, 4, 5, 4, 3, 4], [0]), mobility: false, boneLevelMm: 3.5 }],
      });

  it('compares with the baseline: Desmond 46 with BOP, deeper pocket and bone loss is peri-implantitis (Berglundh et al. 2018); 3-month recall with risk factors (Herrera et al. 2023 EFP S3)', async () => {
    const res = await desmondVisit();
    expect(res.status).toBe(201);
    expect(res.body.exams[0]).toMatchObject({ status: 'peri-implantitis', baselineExamId: expect.any(String) });
    expect(res.body.exams[0].flags).not.toContain('no-baseline');
    expect(res.body.nextRecall).toMatchObject({
      intervalMonths: 3,
      riskFactors: { periodontitisHistory: true, priorPeriImplantitis: true },
    });
    expect(res.body.nextRecall.dueOn).toBe(nextRecallDate(today, { periodontitisHistory: true }));
  });

  it('shows the new status on the Arch and in the Site file, and the exam in the site history', async () => {
    expect((await desmondVisit()).status).toBe(201);
    const arch = await ctx.http.get(`/api/patients/${ids.okafor}`).set('Cookie', cookies.dentist);
    expect(arch.body.sites[0]).toMatchObject({ fdi: 46, maintenanceStatus: 'peri-implantitis', lastExamDate: today });
    const file = await ctx.http.get(`/api/sites/${ids.okafor46}`).set('Cookie', cookies.dentist);
    expect(file.body.maintenanceStatus).toBe('peri-implantitis');
    const history = await ctx.http.get(`/api/recalls/sites/${ids.okafor46}/exams`).set('Cookie', cookies.dentist);
    expect(history.status).toBe(200);
    expect(history.body.exams.at(-1)).toMatchObject({ examinedOn: today, status: 'peri-implantitis' });
    expect(history.body.exams.length).toBeGreaterThan(10);
  });

  const bad: { name: string; body: () => object; field: string }[] = [
    {
      name: 'a depth over 15 mm',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [{ ...healthyExam(ids.ferraz14), sites: sites([3, 3, 3, 16, 3, 3]) }],
      }),
      field: 'exams.0.sites.3.probingDepthMm',
    },
    {
      name: 'a negative depth',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [{ ...healthyExam(ids.ferraz14), sites: sites([3, -1, 3, 3, 3, 3]) }],
      }),
      field: 'exams.0.sites.1.probingDepthMm',
    },
    {
      name: 'a depth not in 0.5 mm steps',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [{ ...healthyExam(ids.ferraz14), sites: sites([3, 3, 3, 3.3, 3, 3]) }],
      }),
      field: 'exams.0.sites.3.probingDepthMm',
    },
    {
      name: 'five sites only',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [{ ...healthyExam(ids.ferraz14), sites: sites([3, 3, 3, 3, 3, 3]).slice(0, 5) }],
      }),
      field: 'exams.0.sites',
    },
    {
      name: 'a site given twice',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [
          {
            ...healthyExam(ids.ferraz14),
            sites: sites([3, 3, 3, 3, 3, 3]).map((s, i) => (i === 5 ? { ...s, position: 'buccal' } : s)),
          },
        ],
      }),
      field: 'exams.0.sites.5.position',
    },
    {
      name: 'a plaque index of 4',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [{ ...healthyExam(ids.ferraz14), plaqueIndex: 4 }],
      }),
      field: 'exams.0.plaqueIndex',
    },
    {
      name: 'a planned site',
      body: () => ({
        patientId: ids.ferraz,
        examinedOn: today,
        exams: [healthyExam(ids.ferraz14), healthyExam(ids.ferraz24)],
      }),
      field: 'exams.1.siteId',
    },
    {
      name: "another patient's site",
      body: () => ({ patientId: ids.ferraz, examinedOn: today, exams: [healthyExam(ids.whitcombe35)] }),
      field: 'exams.0.siteId',
    },
    {
      name: 'an exam dated in the future',
      body: () => ({ patientId: ids.ferraz, examinedOn: '2999-01-01', exams: [healthyExam(ids.ferraz14)] }),
      field: 'examinedOn',
    },
  ];
  it.each(bad)('refuses $name with 400 naming the field, and saves nothing', async ({ body, field }) => {
    const count = async () => (await ctx.db.select({ n: sql<number>`count(*)::int` }).from(recallExams))[0].n;
    const before = await count();
    const res = await ctx.http.post('/api/recalls/visits').set('Cookie', cookies.hygienist).send(body());
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty([field]);
    expect(await count()).toBe(before);
  });
});

describe('amending an exam', () => {
  it('adds a superseding exam with the reason, recomputes the status, and the old one leaves the history; a second amendment of the old one is 409', async () => {
    const visit = await ctx.http
      .post('/api/recalls/visits')
      .set('Cookie', cookies.hygienist)
      .send({ patientId: ids.whitcombe, examinedOn: today, exams: [healthyExam(ids.whitcombe37)] });
    expect(visit.status).toBe(201);
    const old = visit.body.exams[0];
    expect(old.status).toBe('health');
    const body = {
      sites: sites([3, 4, 3, 3, 3, 3], [1]),
      mobility: false,
      amendmentReason: 'Bleeding at the buccal site was missed.',
    };
    for (const who of ['surgeon', 'practice_admin'] as const) {
      expect(
        (await ctx.http.post(`/api/recalls/exams/${old.id}/amend`).set('Cookie', cookies[who]).send(body)).status,
        who,
      ).toBe(403);
    }
    expect(
      (await ctx.http.post(`/api/recalls/exams/${old.id}/amend`).set('Cookie', cookies.otherPracticeDentist).send(body))
        .status,
    ).toBe(404);
    const noReason = await ctx.http
      .post(`/api/recalls/exams/${old.id}/amend`)
      .set('Cookie', cookies.hygienist)
      .send({ ...body, amendmentReason: '' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields).toHaveProperty('amendmentReason');

    const res = await ctx.http.post(`/api/recalls/exams/${old.id}/amend`).set('Cookie', cookies.hygienist).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      supersedesId: old.id,
      amendmentReason: 'Bleeding at the buccal site was missed.',
      status: 'mucositis',
      visitId: old.visitId,
      examinedOn: today,
    });
    const history = await ctx.http.get(`/api/recalls/sites/${ids.whitcombe37}/exams`).set('Cookie', cookies.dentist);
    const mine = history.body.exams.filter((e: { examinedOn: string }) => e.examinedOn === today);
    expect(mine.map((e: { id: string }) => e.id)).toEqual([res.body.id]);
    const arch = await ctx.http.get(`/api/patients/${ids.whitcombe}`).set('Cookie', cookies.dentist);
    expect(arch.body.sites.find((s: { fdi: number }) => s.fdi === 37).maintenanceStatus).toBe('mucositis');
    const again = await ctx.http.post(`/api/recalls/exams/${old.id}/amend`).set('Cookie', cookies.hygienist).send(body);
    expect(again.status).toBe(409);
    // Still stored: amendments never overwrite.
    expect((await ctx.db.select().from(recallExams).where(eq(recallExams.id, old.id))).length).toBe(1);
  });
});

describe('the Recall desk', () => {
  const desk = async (query: Record<string, string | number> = {}, who: AccountKey = 'hygienist') => {
    const res = await ctx.http.get('/api/recalls/desk').query(query).set('Cookie', cookies[who]);
    expect(res.status).toBe(200);
    return res.body as {
      items: {
        chartNumber: string;
        nextDueOn: string | null;
        overdueDays: number;
        sites: { fdi: number; status: string }[];
        riskFactors: Record<string, boolean>;
      }[];
      total: number;
    };
  };

  it('lists the practice patients with implants, with last status per implant and risk factors, sorted by due date', async () => {
    const body = await desk();
    expect(body.items.map((r) => r.chartNumber)).not.toContain('QH-2001');
    expect(body.total).toBe(9); // with the overdenture patients and Signe Marchetti (provisional)
    const dues = body.items.map((r) => r.nextDueOn).filter(Boolean) as string[];
    expect(dues).toEqual([...dues].sort());
    const farrow = body.items.find((r) => r.chartNumber === 'LL-1002')!;
    expect(farrow.overdueDays).toBeGreaterThan(0);
    expect(farrow.riskFactors.smoker).toBe(true);
    expect(farrow.sites.map((s) => s.fdi)).toEqual([32, 35, 42, 45]);
    const ferraz = body.items.find((r) => r.chartNumber === 'LL-1004')!;
    expect(ferraz.sites).toEqual([expect.objectContaining({ fdi: 14, status: 'health' })]);
  });

  it('filters overdue, due this week and peri-implantitis last time; pages', async () => {
    expect((await desk({ filter: 'overdue' })).items.map((r) => r.chartNumber)).toEqual(['LL-1002']);
    expect((await desk({ filter: 'peri-implantitis-last' })).items.map((r) => r.chartNumber)).toEqual(['LL-1003']);
    for (const r of (await desk({ filter: 'due-this-week' })).items) expect(r.overdueDays).toBe(0);
    const page = await desk({ pageSize: 2, page: 2, sort: 'name' });
    expect(page.items).toHaveLength(2);
    expect(page.total).toBe(9);
  });

  it('sorts by name, by overdue days (most overdue first) and by last exam, in SQL', async () => {
    const names = (await desk({ sort: 'name' })).items.map((r) => r.chartNumber);
    // Achterberg, Farrow, Ferraz, Lindqvist, Marchetti, Okafor, Ravensworth, Thornbury, Whitcombe
    expect(names).toEqual([
      'LL-1005',
      'LL-1002',
      'LL-1004',
      'LL-1006',
      'LL-1009',
      'LL-1003',
      'LL-1007',
      'LL-1008',
      'LL-1001',
    ]);
    const byName = (await desk({ sort: 'name', dir: 'desc' })).items.map((r) => r.chartNumber);
    expect(byName).toEqual([...names].reverse());
    const overdue = (await desk({ sort: 'overdueDays', dir: 'desc' })).items;
    expect(overdue[0].chartNumber).toBe('LL-1002');
    const lastExam = (await desk({ sort: 'lastExamOn', dir: 'desc' })).items as unknown as {
      lastExamOn: string | null;
    }[];
    const dates = lastExam.map((r) => r.lastExamOn).filter(Boolean) as string[];
    expect(dates).toEqual([...dates].sort().reverse());
  });

  it('exports the same rows as CSV', async () => {
    const res = await ctx.http
      .get('/api/recalls/desk/csv')
      .query({ filter: 'overdue' })
      .set('Cookie', cookies.hygienist);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toBe(
      'chart number,patient,phone,e-mail,next recall,overdue days,last exam,last status per implant,risk factors',
    );
    expect(lines).toHaveLength(2);
    expect(lines[1]).toMatch(/^LL-1002,Imogen Farrow,/);
  });

  it('refuses an unknown filter with 400 naming it', async () => {
    const res = await ctx.http
      .get('/api/recalls/desk')
      .query({ filter: 'everything' })
      .set('Cookie', cookies.hygienist);
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('filter');
  });

  it('the surgeon sees only the patients shared with him', async () => {
    const body = await desk({}, 'surgeon');
    expect(body.items.map((r) => r.chartNumber).sort()).toEqual(['LL-1001', 'LL-1002', 'LL-1004', 'LL-1005']);
  });
});

describe('"today" is injectable', () => {
  it('a pinned day moves the desk: Harold, due in about three weeks, is overdue a year later', async () => {
    const clock = ctx.app.get(RecallClock);
    clock.pin('2099-01-01');
    try {
      const res = await ctx.http.get('/api/recalls/desk').query({ filter: 'overdue' }).set('Cookie', cookies.hygienist);
      expect(res.body.today).toBe('2099-01-01');
      expect(res.body.items.map((r: { chartNumber: string }) => r.chartNumber)).toContain('LL-1001');
    } finally {
      clock.pin(null);
    }
  });
});

describe('the recall policy', () => {
  it('starts at the defaults (6 and 3 months [common practice]), is changed by the practice admin and then used for the next recall', async () => {
    const before = await ctx.http.get('/api/recalls/policy').set('Cookie', cookies.hygienist);
    expect(before.body).toMatchObject({ baseMonths: 6, riskMonths: 3 });
    const put = await ctx.http
      .put('/api/recalls/policy')
      .set('Cookie', cookies.practice_admin)
      .send({ baseMonths: 12, riskMonths: 4, reminderDaysBefore: 10, overdueReminderDaysAfter: 5 });
    try {
      expect(put.status).toBe(200);
      expect(put.body).toMatchObject({ baseMonths: 12, riskMonths: 4, isDefault: false });
      const visit = await ctx.http
        .post('/api/recalls/visits')
        .set('Cookie', cookies.hygienist)
        .send({ patientId: ids.ferraz, examinedOn: today, exams: [healthyExam(ids.ferraz14)] });
      expect(visit.body.nextRecall).toMatchObject({
        intervalMonths: 12,
        dueOn: nextRecallDate(today, {}, { baseMonths: 12, riskMonths: 4 }),
      });
    } finally {
      // The other tests of this file expect the default intervals, whichever order they run in.
      const { baseMonths, riskMonths, reminderDaysBefore, overdueReminderDaysAfter } = before.body;
      await ctx.http
        .put('/api/recalls/policy')
        .set('Cookie', cookies.practice_admin)
        .send({ baseMonths, riskMonths, reminderDaysBefore, overdueReminderDaysAfter });
    }
  });

  it('refuses a risk interval longer than the base interval', async () => {
    const res = await ctx.http
      .put('/api/recalls/policy')
      .set('Cookie', cookies.practice_admin)
      .send({ baseMonths: 3, riskMonths: 6, reminderDaysBefore: 10, overdueReminderDaysAfter: 5 });
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('riskMonths');
  });
});
