// Recall history of the demo patients (shared/design/demo-scenario.md): exams with six-site
// probing, each status computed with classifyPeriImplant against the baseline chosen as the API
// chooses it (never hard-coded), the next recall from nextRecallDate, and a few reminder_log rows.
// Harold 6-monthly since 2013 (next due in three weeks); Imogen (smoker) 3-monthly, mucositis at
// 45 in 2021 then resolved, one recall overdue; Desmond ~3 mm bone loss with BOP and a 7 mm
// pocket in 2023 (peri-implantitis), treated, monitored every 3 months; Lucía 14 healthy; Wendell none.
import { randomUUID } from 'node:crypto';
import {
  addCalendarDays,
  addCalendarMonths,
  choosePeriImplantBaseline,
  classifyPeriImplant,
  DEFAULT_BONE_LOSS_MM,
  DEFAULT_OVERDUE_REMINDER_DAYS_AFTER,
  DEFAULT_PD_INCREASE_MM,
  DEFAULT_REMINDER_DAYS_BEFORE,
  nextRecallDate,
  PROBING_POSITIONS,
  type RecordedExam,
  RULES_VERSION,
  toPeriImplantBaseline,
  toPeriImplantExam,
} from '@torquetrail/domain';
import type { Tx } from '../db/database.js';
import { recallExams, recallExamSites, recalls, reminderLog } from '../db/schema/index.js';
import type { DemoRefs } from './demo-scenario.js';
import { reminderKey } from '../recalls/exam-rules.js';

const RULE_OPTIONS = { pdIncreaseMm: DEFAULT_PD_INCREASE_MM, boneLossMm: DEFAULT_BONE_LOSS_MM };
const HOLT = 'maren.holt@larkspur.example';
const SANDHU = 'priya.sandhu@larkspur.example';

interface SiteFinding {
  /** Six depths, mesiobuccal … distolingual, e.g. '3 3 2 3 3 3'. */
  pd: string;
  /** Six flags, 1 = bleeding on probing, e.g. '000100'. */
  bop?: string;
  sup?: string;
  bone?: number;
  baseline?: boolean;
  plaque?: number;
  notes?: string;
}

interface Visit {
  on: string;
  examiner: string;
  sites: Record<number, SiteFinding>;
}

const flags = (s: string | undefined) => PROBING_POSITIONS.map((_, i) => s?.[i] === '1');

/** Dates every `months` back from `last` to no earlier than `from`, oldest first. */
function every(months: number, last: string, from: string): string[] {
  const out: string[] = [];
  for (let k = 0; ; k += 1) {
    const d = addCalendarMonths(last, -months * k);
    if (d < from) break;
    out.unshift(d);
  }
  return out;
}

export async function seedDemoRecallHistory(tx: Tx, refs: DemoRefs): Promise<{ exams: number }> {
  const today = refs.today;
  const practiceId = refs.practiceIds.larkspur;
  const examiner = (i: number) => refs.userIds.get(i % 2 === 0 ? HOLT : SANDHU)!;
  let examCount = 0;

  async function seedPatient(
    chart: string,
    visits: Visit[],
    deliveredOn: Record<number, string | null>,
    risk: { smoker?: boolean; periodontitisHistory?: boolean },
  ) {
    const patientId = refs.patientIds.get(chart)!;
    const earlier = new Map<number, (RecordedExam & { id: string })[]>();
    let anyPi = false;
    for (const visit of visits) {
      const visitId = randomUUID();
      for (const [fdiText, f] of Object.entries(visit.sites)) {
        const fdi = Number(fdiText);
        const siteId = refs.siteIds.get(`${chart}:${fdi}`)!;
        const depths = f.pd.trim().split(/\s+/).map(Number);
        const bop = flags(f.bop);
        const sup = flags(f.sup);
        const sites = PROBING_POSITIONS.map((position, i) => ({
          position,
          probingDepthMm: depths[i],
          bleeding: bop[i],
          suppuration: sup[i],
        }));
        const history = earlier.get(fdi) ?? [];
        const isBaseline = f.baseline ?? false;
        const baseline = choosePeriImplantBaseline(
          history,
          { examinedOn: visit.on, isBaseline },
          deliveredOn[fdi] ?? null,
        );
        const boneLevelMm = f.bone ?? null;
        const verdict = classifyPeriImplant(
          toPeriImplantExam({ sites, boneLevelMm }),
          toPeriImplantBaseline({ isBaseline }, baseline),
          RULE_OPTIONS,
        );
        anyPi ||= verdict.status === 'peri-implantitis';
        const recordedAt = new Date(`${visit.on}T11:00:00Z`);
        const [row] = await tx
          .insert(recallExams)
          .values({
            practiceId,
            patientId,
            siteId,
            visitId,
            examinedOn: visit.on,
            examinerId: visit.examiner,
            mobility: false,
            plaqueIndex: f.plaque ?? 0,
            bleedingIndex: bop.filter(Boolean).length > 1 ? 2 : bop.some(Boolean) ? 1 : 0,
            keratinizedMucosaMm: 2,
            residualCement: false,
            boneLevelMm,
            isBaseline: f.baseline ?? false,
            notes: f.notes ?? null,
            status: verdict.status,
            reasons: verdict.reasons,
            flags: verdict.flags,
            rulesVersion: RULES_VERSION,
            ruleOptions: RULE_OPTIONS,
            baselineExamId: baseline?.id ?? null,
            recordedAt,
          })
          .returning({ id: recallExams.id });
        await tx.insert(recallExamSites).values(sites.map((s) => ({ practiceId, examId: row.id, ...s })));
        history.push({
          id: row.id,
          examinedOn: visit.on,
          recordedAt,
          isBaseline: f.baseline ?? false,
          boneLevelMm,
          sites,
        });
        earlier.set(fdi, history);
        examCount += 1;
      }
    }
    const last = visits[visits.length - 1].on;
    const dueOn = nextRecallDate(last, { ...risk, priorPeriImplantitis: anyPi });
    await tx.insert(recalls).values({ practiceId, patientId, dueOn, status: 'scheduled' });
    return { patientId, dueOn, visits };
  }

  // 1. Harold Whitcombe: 35 and 37, bridge delivered 2012-09-20; 6-monthly since 2013, next due in three weeks.
  const haroldDates = every(6, addCalendarMonths(addCalendarDays(today, 21), -6), '2013-03-01');
  const harold = await seedPatient(
    'LL-1001',
    haroldDates.map((on, i) => {
      const radiograph = i === 0 || i % 4 === 0;
      const bone = 0.8 + Math.min(0.3, i * 0.015);
      const loosened = on.startsWith('2016-05') || (on >= '2016-03-01' && on < '2016-06-30');
      return {
        on,
        examiner: examiner(i),
        sites: {
          35: {
            pd: loosened ? '3 4 3 3 3 3' : '3 3 3 2 3 3',
            bop: loosened ? '010000' : undefined,
            bone: radiograph ? Math.round(bone * 10) / 10 : undefined,
            plaque: loosened ? 2 : 1,
            notes: loosened ? 'Bridge screws found loose; re-torqued (see torque record).' : undefined,
          },
          37: { pd: '3 3 3 3 3 2', bone: radiograph ? Math.round((bone + 0.1) * 10) / 10 : undefined, plaque: 1 },
        },
      };
    }),
    { 35: '2012-09-20', 37: '2012-09-20' },
    {},
  );

  // 2. Imogen Farrow (smoker): full arch delivered 2018-04-11; mucositis at 45 in 2021, resolved; last recall overdue.
  const imogenLast = addCalendarMonths(addCalendarDays(today, -20), -3);
  const calm = (bone?: number) => ({
    32: { pd: '3 3 3 3 3 3', bone },
    42: { pd: '3 3 3 3 3 3', bone },
    35: { pd: '3 3 4 3 3 3', bone },
    45: { pd: '3 3 4 3 3 3', bone },
  });
  const imogenVisits: Visit[] = [
    { on: '2018-05-09', examiner: examiner(0), sites: calm(1.0) },
    { on: '2019-05-14', examiner: examiner(1), sites: calm(1.2) },
    { on: '2020-05-19', examiner: examiner(0), sites: calm() },
    {
      on: '2021-03-16',
      examiner: examiner(1),
      sites: {
        ...calm(1.3),
        45: {
          pd: '4 4 5 4 3 4',
          bop: '011100',
          bone: 1.3,
          plaque: 2,
          notes: 'Plaque under the distal cantilever; oral hygiene instruction, interdental brushes.',
        },
      },
    },
    {
      on: '2021-06-15',
      examiner: examiner(0),
      sites: { ...calm(), 45: { pd: '3 3 4 3 3 3', notes: 'Bleeding resolved after home care.' } },
    },
    ...every(3, imogenLast, addCalendarMonths(imogenLast, -12)).map((on, i) => ({
      on,
      examiner: examiner(i),
      sites: calm(i === 0 ? 1.4 : undefined),
    })),
  ];
  const imogen = await seedPatient(
    'LL-1002',
    imogenVisits,
    { 32: '2018-04-11', 42: '2018-04-11', 35: '2018-04-11', 45: '2018-04-11' },
    { smoker: true },
  );

  // 3. Desmond Okafor (periodontitis history): crown 2015-02-18; ~3 mm bone loss, BOP and a 7 mm pocket in 2023 → treated; 3-monthly since.
  const desmondLast = addCalendarDays(today, -40);
  const monitoring = every(3, desmondLast, '2023-09-01');
  const desmondVisits: Visit[] = [
    {
      on: '2015-03-24',
      examiner: examiner(0),
      sites: { 46: { pd: '3 3 3 3 2 3', bone: 0.5, baseline: true, notes: 'Baseline after crown delivery.' } },
    },
    ...['2016-03-15', '2017-03-21', '2018-03-20', '2019-03-19', '2020-09-22', '2021-09-21'].map((on, i) => ({
      on,
      examiner: examiner(i + 1),
      sites: {
        46: {
          pd: i < 4 ? '3 3 3 3 3 3' : '4 3 4 3 3 3',
          bop: i >= 4 ? '100000' : undefined,
          bone: i % 2 === 0 ? 0.6 + i * 0.2 : undefined,
        },
      },
    })),
    {
      on: '2022-09-20',
      examiner: examiner(1),
      sites: {
        46: { pd: '5 4 5 4 3 4', bop: '101000', bone: 2.1, notes: 'Cement-retained crown; no residual cement seen.' },
      },
    },
    {
      on: '2023-05-16',
      examiner: examiner(0),
      sites: {
        46: {
          pd: '7 5 6 5 4 5',
          bop: '111100',
          sup: '100000',
          bone: 3.4,
          plaque: 2,
          notes: 'Referred to Dr Calloway: non-surgical debridement, then surgical treatment.',
        },
      },
    },
    // Monitoring: pockets reduced, bone stable at its new level; bleeding at one site comes and goes.
    ...monitoring.map((on, i) => {
      const last = i === monitoring.length - 1;
      return {
        on,
        examiner: examiner(i),
        sites: {
          46: {
            pd: i < 2 || last ? '5 4 5 4 3 4' : '4 4 4 4 3 4',
            bop: i < 2 || last ? '100000' : undefined,
            bone: i % 4 === 0 || last ? 3.4 : undefined,
          },
        },
      };
    }),
  ];
  const desmond = await seedPatient('LL-1003', desmondVisits, { 46: '2015-02-18' }, { periodontitisHistory: true });

  // 4. Lucía Ferraz: 14 healthy, 6-monthly since the crown (2020-03-09).
  const luciaLast = addCalendarDays(today, -60);
  await seedPatient(
    'LL-1004',
    every(6, luciaLast, '2020-04-01').map((on, i) => ({
      on,
      examiner: examiner(i),
      sites: { 14: { pd: '2 3 2 2 3 2', bone: i === 0 || i % 4 === 0 ? 0.4 : undefined } },
    })),
    { 14: '2020-03-09' },
    {},
  );

  // A few reminders already sent (and one that needed a retry); all with the idempotency key the job uses.
  const sentAt = (iso: string) => new Date(`${iso}T06:00:00Z`);
  const prevDue = (visits: string[]) => visits[visits.length - 1]; // the last visit was the previous recall
  const log = [
    {
      patientId: harold.patientId,
      recallDueOn: prevDue(haroldDates),
      kind: 'upcoming' as const,
      sentOn: addCalendarDays(prevDue(haroldDates), -DEFAULT_REMINDER_DAYS_BEFORE),
      attempts: 1,
    },
    {
      patientId: imogen.patientId,
      recallDueOn: imogen.dueOn,
      kind: 'upcoming' as const,
      sentOn: addCalendarDays(imogen.dueOn, -DEFAULT_REMINDER_DAYS_BEFORE),
      attempts: 1,
    },
    {
      patientId: imogen.patientId,
      recallDueOn: imogen.dueOn,
      kind: 'overdue' as const,
      sentOn: addCalendarDays(imogen.dueOn, DEFAULT_OVERDUE_REMINDER_DAYS_AFTER),
      attempts: 2,
    },
    {
      patientId: desmond.patientId,
      recallDueOn: desmondLast,
      kind: 'upcoming' as const,
      sentOn: addCalendarDays(desmondLast, -DEFAULT_REMINDER_DAYS_BEFORE),
      attempts: 1,
    },
  ].filter((r) => r.sentOn <= today);
  if (log.length > 0) {
    await tx.insert(reminderLog).values(
      log.map((r) => ({
        practiceId,
        patientId: r.patientId,
        recallDueOn: r.recallDueOn,
        kind: r.kind,
        idempotencyKey: reminderKey(r.patientId, r.recallDueOn, r.kind),
        status: 'sent' as const,
        attempts: r.attempts,
        lastError: null,
        messageId: `<seed-${randomUUID()}@torquetrail.local>`,
        sentAt: sentAt(r.sentOn),
        createdAt: sentAt(r.sentOn),
      })),
    );
  }
  return { exams: examCount };
}
