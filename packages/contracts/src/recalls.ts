// Maintenance recall contracts (Recall desk, exams, policy, reminders).
import { z } from 'zod';
import { keepingOmitted } from './amendment.js';
import { FdiPosition, Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import { RECALL_MONTHS_RANGE } from '@torquetrail/domain';
import type { RouteContract } from './route-contract.js';
import {
  ArchiveFilter,
  DeskFilter,
  DeskSort,
  MaintenanceStatus,
  PeriImplantStatus,
  ProbingPosition,
  ReminderKind,
  ReminderStatus,
  SiteStatus,
  SortDirection,
} from './enums.js';

const halfMm = (max: number, what: string) =>
  z
    .number({ error: `${what} must be a number of mm` })
    .min(0, { error: `${what} must be 0–${max} mm` })
    .max(max, { error: `${what} must be 0–${max} mm` })
    .refine((v) => Number.isInteger(v * 2), { error: `${what} must be in 0.5 mm steps` });

/** Probing depth, 0–15 mm in 0.5 mm steps (a periodontal probe's resolution). */
export const ProbingDepthMm = halfMm(15, 'probing depth');

export const ExamSiteInput = z.object({
  position: ProbingPosition,
  probingDepthMm: ProbingDepthMm,
  bleeding: z.boolean(),
  suppuration: z.boolean(),
});
export type ExamSiteInput = z.infer<typeof ExamSiteInput>;

const Index03 = z.number().int().min(0).max(3);

/** One implant's exam within a visit: all six sites, each once. */
export const SiteExamInput = z.object({
  siteId: Id,
  sites: z
    .array(ExamSiteInput)
    .length(6, { error: 'all six probing sites are required' })
    .superRefine((sites, ctx) => {
      const seen = new Set<string>();
      sites.forEach((s, i) => {
        if (seen.has(s.position))
          ctx.addIssue({ code: 'custom', message: `${s.position} is given twice`, path: [i, 'position'] });
        seen.add(s.position);
      });
    }),
  mobility: z.boolean(),
  /** Modified plaque index (0–3). */
  plaqueIndex: Index03.nullable().default(null),
  /** Modified bleeding index (0–3). */
  bleedingIndex: Index03.nullable().default(null),
  keratinizedMucosaMm: halfMm(15, 'keratinized mucosa width').nullable().default(null),
  residualCement: z.boolean().default(false),
  /** Radiographic bone level when known: mm apical to the most coronal intra-osseous part, worse of mesial/distal. */
  boneLevelMm: z.number().min(0).max(20).nullable().default(null),
  /** The radiograph measurement the bone level was accepted from; null when typed. */
  boneLevelMeasurementId: Id.nullable().default(null),
  isBaseline: z.boolean().default(false),
  notes: NoteText(2000).nullable().default(null),
});
export type SiteExamInput = z.input<typeof SiteExamInput>;

/** One visit: several implants of one patient examined the same day share a visitId. */
export const CreateVisitBody = z
  .object({
    patientId: Id,
    examinedOn: IsoDate,
    exams: z.array(SiteExamInput).min(1).max(32),
  })
  .superRefine((body, ctx) => {
    const seen = new Set<string>();
    body.exams.forEach((e, i) => {
      if (seen.has(e.siteId))
        ctx.addIssue({
          code: 'custom',
          message: 'this implant is examined twice in one visit',
          path: ['exams', i, 'siteId'],
        });
      seen.add(e.siteId);
    });
  });
export type CreateVisitBody = z.input<typeof CreateVisitBody>;

/** An amendment replaces one exam (a new row that supersedes it, with the reason); never an overwrite. */
export const AmendExamBody = z.object({
  ...keepingOmitted(SiteExamInput.omit({ siteId: true }).shape),
  amendmentReason: NoteText(500).min(3, { error: 'say why the exam is amended' }),
});
export type AmendExamBody = z.input<typeof AmendExamBody>;

export const RecallExam = z.object({
  id: Id,
  patientId: Id,
  siteId: Id,
  fdi: FdiPosition,
  visitId: Id,
  examinedOn: IsoDate,
  /** A share's reply leaves out the examiner, the notes and the amendment's reason. */
  examinerName: z.string().optional(),
  sites: z.array(ExamSiteInput),
  mobility: z.boolean(),
  plaqueIndex: z.number().int().nullable(),
  bleedingIndex: z.number().int().nullable(),
  keratinizedMucosaMm: z.number().nullable(),
  residualCement: z.boolean(),
  boneLevelMm: z.number().nullable(),
  boneLevelMeasurementId: Id.nullable(),
  isBaseline: z.boolean(),
  notes: z.string().nullable().optional(),
  /** Computed on the server by classifyPeriImplant (2017 World Workshop case definitions); not a diagnosis. */
  status: PeriImplantStatus,
  reasons: z.array(z.string()),
  flags: z.array(z.string()),
  rulesVersion: z.string(),
  ruleOptions: z.record(z.string(), z.number()),
  /** The exam used as baseline for this one, if any. */
  baselineExamId: Id.nullable(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  recordedAt: IsoDateTime,
});
export type RecallExam = z.infer<typeof RecallExam>;

export const RiskFactors = z.object({
  smoker: z.boolean(),
  diabetesPoorlyControlled: z.boolean(),
  periodontitisHistory: z.boolean(),
  /** Derived: any earlier exam of the patient computed as peri-implantitis. */
  priorPeriImplantitis: z.boolean(),
});
export type RiskFactors = z.infer<typeof RiskFactors>;

const policyMonths = z.number().int().min(RECALL_MONTHS_RANGE.min).max(RECALL_MONTHS_RANGE.max);
export const RecallPolicy = z.object({
  baseMonths: policyMonths,
  riskMonths: policyMonths,
  reminderDaysBefore: z.number().int().min(0).max(90),
  overdueReminderDaysAfter: z.number().int().min(0).max(180),
});
export type RecallPolicy = z.infer<typeof RecallPolicy>;
export const RecallPolicyBody = RecallPolicy.refine((p) => p.riskMonths <= p.baseMonths, {
  error: 'the interval with risk factors must not be longer than the base interval',
  path: ['riskMonths'],
});
export type RecallPolicyBody = z.infer<typeof RecallPolicyBody>;
export const RecallPolicyReply = RecallPolicy.extend({ isDefault: z.boolean(), updatedAt: IsoDateTime.nullable() });
export type RecallPolicyReply = z.infer<typeof RecallPolicyReply>;

export const CreateVisitReply = z.object({
  visitId: Id,
  exams: z.array(RecallExam),
  nextRecall: z.object({ dueOn: IsoDate, intervalMonths: z.number().int(), riskFactors: RiskFactors }),
});
export type CreateVisitReply = z.infer<typeof CreateVisitReply>;

/** What the exam form needs: the patient's implants with their baseline and previous exam. */
export const ExamContext = z.object({
  patient: z.object({ id: Id, chartNumber: z.string(), name: z.string(), riskFactors: RiskFactors.optional() }),
  today: IsoDate,
  /** null for a user whose role may not read the practice's policy (a referring surgeon). */
  policy: RecallPolicyReply.nullable().optional(),
  sites: z.array(
    z.object({
      siteId: Id,
      fdi: FdiPosition,
      status: SiteStatus,
      /** Only placed or restored implants are examined. */
      examinable: z.boolean(),
      deliveredOn: IsoDate.nullable(),
      baseline: RecallExam.nullable(),
      previous: RecallExam.nullable(),
      /**
       * The site's current measured bone levels (worse of mesial/distal), latest first; the form offers
       * the one `boneLevelOfferFor` (packages/domain) picks for the exam's date.
       */
      measuredBoneLevels: z.array(
        z.object({
          measurementId: Id,
          radiographId: Id,
          boneLevelMm: z.number(),
          mesialMm: z.number(),
          distalMm: z.number(),
          takenOn: IsoDate.nullable(),
          measuredAt: IsoDateTime,
          measuredBy: z.string().optional(),
        }),
      ),
    }),
  ),
});
export type ExamContext = z.infer<typeof ExamContext>;

export const SiteExamHistory = z.object({ siteId: Id, fdi: FdiPosition, patientId: Id, exams: z.array(RecallExam) });
export type SiteExamHistory = z.infer<typeof SiteExamHistory>;

export const RecallDeskQuery = z.object({
  filter: DeskFilter.default('all'),
  sort: DeskSort.default('dueOn'),
  dir: SortDirection.default('asc'),
  search: PlainText(100).optional(),
  /** Archived patients leave the desk unless asked for. */
  archived: ArchiveFilter.default('active'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type RecallDeskQuery = z.infer<typeof RecallDeskQuery>;
export const RecallDeskCsvQuery = RecallDeskQuery.omit({ page: true, pageSize: true });
export type RecallDeskCsvQuery = z.infer<typeof RecallDeskCsvQuery>;

export const DeskSite = z.object({
  siteId: Id,
  fdi: FdiPosition,
  status: MaintenanceStatus,
  lastExamOn: IsoDate.nullable(),
});
export const RecallDeskRow = z.object({
  patientId: Id,
  chartNumber: z.string(),
  name: z.string(),
  nextDueOn: IsoDate.nullable(),
  /** Days past the due date (0 when not overdue or not scheduled). */
  overdueDays: z.number().int(),
  lastExamOn: IsoDate.nullable(),
  sites: z.array(DeskSite),
  /** Absent for a shared surgeon (the share's field rules do not name them). */
  riskFactors: RiskFactors.optional(),
  /**
   * Delivered provisionals still in place after their planned replacement day (provisionalOverdue
   * in @torquetrail/domain). Absent for a shared surgeon's rows [decision: the desk flags the
   * practice's own follow-up].
   */
  provisionalsOverdue: z
    .array(z.object({ restorationId: Id, fdis: z.array(FdiPosition), plannedReplacementOn: IsoDate }))
    .optional(),
  /**
   * Delivered overdentures whose insert review is overdue: the last insert change of their sites
   * (or the delivery when none) is older than the practice's interval. Absent for a shared
   * surgeon's rows, like `provisionalsOverdue`.
   */
  insertReviewsOverdue: z
    .array(
      z.object({
        restorationId: Id,
        fdis: z.array(FdiPosition),
        lastChangeOn: IsoDate.nullable(),
        reviewDueOn: IsoDate,
      }),
    )
    .optional(),
});
export type RecallDeskRow = z.infer<typeof RecallDeskRow>;
export const RecallDeskReply = z.object({
  items: z.array(RecallDeskRow),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  today: IsoDate,
});
export type RecallDeskReply = z.infer<typeof RecallDeskReply>;

export const RunRemindersBody = z.object({
  /** The day to scan as "today"; only honoured outside production (tests, demos). */
  today: IsoDate.optional(),
});
export type RunRemindersBody = z.infer<typeof RunRemindersBody>;
export const RunRemindersReply = z.object({ today: IsoDate, logged: z.number().int(), queued: z.number().int() });
export type RunRemindersReply = z.infer<typeof RunRemindersReply>;

export const ReminderLogItem = z.object({
  id: Id,
  patientId: Id,
  patientName: z.string(),
  chartNumber: z.string(),
  recallDueOn: IsoDate,
  kind: ReminderKind,
  status: ReminderStatus,
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  sentAt: IsoDateTime.nullable(),
  createdAt: IsoDateTime,
});
export type ReminderLogItem = z.infer<typeof ReminderLogItem>;
export const ReminderLogReply = z.object({ items: z.array(ReminderLogItem) });
export type ReminderLogReply = z.infer<typeof ReminderLogReply>;

export const recallRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/recalls/desk',
    summary:
      "Recall desk: the practice's patients with implants, next recall, overdue days, last status per implant, risk factors (paged and sorted in SQL)",
    signedIn: true,
    query: RecallDeskQuery,
    reply: RecallDeskReply,
  },
  {
    method: 'get',
    path: '/recalls/desk/csv',
    summary: 'The Recall desk as CSV, with the same filters and sort',
    signedIn: true,
    query: RecallDeskCsvQuery,
    produces: 'text/csv',
  },
  {
    method: 'get',
    path: '/recalls/patients/:id/exam-context',
    summary:
      "A patient's implants with their baseline and previous exam, risk factors and the practice policy, for the exam form",
    signedIn: true,
    reply: ExamContext,
  },
  {
    method: 'post',
    path: '/recalls/visits',
    summary:
      'Record a maintenance visit: one exam per implant; the status is computed on the server and the next recall scheduled',
    signedIn: true,
    body: CreateVisitBody,
    reply: CreateVisitReply,
  },
  {
    method: 'post',
    path: '/recalls/exams/:id/amend',
    summary:
      'Amend one exam: a new exam superseding it, with the reason; status recomputed on the server, next recall rescheduled',
    signedIn: true,
    body: AmendExamBody,
    reply: RecallExam,
  },
  {
    method: 'get',
    path: '/recalls/sites/:id/exams',
    summary: "A site's exam history (probing depths and computed status over the years)",
    signedIn: true,
    reply: SiteExamHistory,
  },
  {
    method: 'get',
    path: '/recalls/policy',
    summary: "The practice's recall and reminder policy",
    signedIn: true,
    reply: RecallPolicyReply,
  },
  {
    method: 'put',
    path: '/recalls/policy',
    summary: "Change the practice's recall and reminder policy (practice admin)",
    signedIn: true,
    body: RecallPolicyBody,
    reply: RecallPolicyReply,
  },
  {
    method: 'post',
    path: '/recalls/reminders/run',
    status: 200,
    summary: 'Run the daily reminder scan now (practice admin): logs and queues the reminders that are due',
    signedIn: true,
    body: RunRemindersBody,
    reply: RunRemindersReply,
  },
  {
    method: 'get',
    path: '/recalls/reminders',
    summary: 'The reminder log of the practice (practice admin)',
    signedIn: true,
    reply: ReminderLogReply,
  },
];
