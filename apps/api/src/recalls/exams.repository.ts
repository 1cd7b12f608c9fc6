// SQL for recall exams. Scope is applied by the callers' patient/site look-ups (visiblePatients).
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { RecallExam } from '@torquetrail/contracts';
import {
  DEFAULT_OVERDUE_REMINDER_DAYS_AFTER,
  DEFAULT_RECALL_MONTHS,
  DEFAULT_REMINDER_DAYS_BEFORE,
  DEFAULT_RISK_RECALL_MONTHS,
  inChartOrder,
  type PeriImplantStatus,
  type ProbedSite,
} from '@torquetrail/domain';
import type { Database, Db, Tx } from '../db/database.js';
import { preparedFor } from '../db/prepared.js';
import {
  implantSites,
  patients,
  recallExams,
  recallExamSites,
  recallPolicies,
  recalls,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { scopeParams, visiblePatients, visiblePatientsPrepared } from '../authz/visible-patients.js';
import { insertAmendment, isAmended, isCurrentVersion } from '../db/amendments.js';

/** Not superseded by an amendment. */
// Qualified by hand: drizzle leaves columns unqualified in single-table selects, and an unqualified
// "id" inside the subquery would bind to e2.
const isCurrent = isCurrentVersion(recallExams);

export type ExamRow = RecallExam & { practiceId: string; recordedAtDate: Date };

const examColumns = {
  id: recallExams.id,
  practiceId: recallExams.practiceId,
  patientId: recallExams.patientId,
  siteId: recallExams.siteId,
  fdi: implantSites.fdi,
  visitId: recallExams.visitId,
  examinedOn: recallExams.examinedOn,
  examinerName: users.displayName,
  mobility: recallExams.mobility,
  plaqueIndex: recallExams.plaqueIndex,
  bleedingIndex: recallExams.bleedingIndex,
  keratinizedMucosaMm: recallExams.keratinizedMucosaMm,
  residualCement: recallExams.residualCement,
  boneLevelMm: recallExams.boneLevelMm,
  boneLevelMeasurementId: recallExams.boneLevelMeasurementId,
  isBaseline: recallExams.isBaseline,
  notes: recallExams.notes,
  status: recallExams.status,
  reasons: recallExams.reasons,
  flags: recallExams.flags,
  rulesVersion: recallExams.rulesVersion,
  ruleOptions: recallExams.ruleOptions,
  baselineExamId: recallExams.baselineExamId,
  supersedesId: recallExams.supersedesId,
  amendmentReason: recallExams.amendmentReason,
  recordedAt: recallExams.recordedAt,
};

/** Current exams of the given sites, oldest first, with their six probing sites. */
export async function listExamsOfSites(db: Db, siteIds: string[]): Promise<ExamRow[]> {
  if (siteIds.length === 0) return [];
  const rows = await db
    .select(examColumns)
    .from(recallExams)
    .innerJoin(implantSites, eq(implantSites.id, recallExams.siteId))
    .innerJoin(users, eq(users.id, recallExams.examinerId))
    .where(and(inArray(recallExams.siteId, siteIds), isCurrent))
    .orderBy(asc(recallExams.examinedOn), asc(recallExams.recordedAt));
  return attachSites(db, rows);
}

/**
 * The exam history of one site (current exams, oldest first, with their probing sites): the
 * exams and the probing rows read side by side, each a prepared statement keyed by the site.
 */
export async function listExamsOfSite(db: Database, siteId: string): Promise<ExamRow[]> {
  const [rows, probes] = await Promise.all([
    siteExamsQuery(db).execute({ siteId }),
    siteProbesQuery(db).execute({ siteId }),
  ]);
  return withProbes(rows, probes);
}
const siteExamsQuery = preparedFor((db) =>
  db
    .select(examColumns)
    .from(recallExams)
    .innerJoin(implantSites, eq(implantSites.id, recallExams.siteId))
    .innerJoin(users, eq(users.id, recallExams.examinerId))
    .where(and(eq(recallExams.siteId, sql.placeholder('siteId')), isCurrent))
    .orderBy(asc(recallExams.examinedOn), asc(recallExams.recordedAt))
    .prepare('exam_history_exams'),
);
const probeColumns = {
  examId: recallExamSites.examId,
  position: recallExamSites.position,
  probingDepthMm: recallExamSites.probingDepthMm,
  bleeding: recallExamSites.bleeding,
  suppuration: recallExamSites.suppuration,
};
const siteProbesQuery = preparedFor((db) =>
  db
    .select(probeColumns)
    .from(recallExamSites)
    .innerJoin(recallExams, eq(recallExams.id, recallExamSites.examId))
    .where(and(eq(recallExams.siteId, sql.placeholder('siteId')), isCurrent))
    .prepare('exam_history_probes'),
);

async function attachSites(
  db: Db,
  rows: (Omit<ExamRow, 'sites' | 'recordedAt' | 'recordedAtDate'> & { recordedAt: Date })[],
): Promise<ExamRow[]> {
  if (rows.length === 0) return [];
  const probes = await db
    .select(probeColumns)
    .from(recallExamSites)
    .where(
      inArray(
        recallExamSites.examId,
        rows.map((r) => r.id),
      ),
    );
  return withProbes(rows, probes);
}

function withProbes(
  rows: (Omit<ExamRow, 'sites' | 'recordedAt' | 'recordedAtDate'> & { recordedAt: Date })[],
  probes: {
    examId: string;
    position: ProbedSite['position'];
    probingDepthMm: number;
    bleeding: boolean;
    suppuration: boolean;
  }[],
): ExamRow[] {
  const byExam = new Map<string, ProbedSite[]>();
  for (const p of probes) {
    const list = byExam.get(p.examId) ?? [];
    list.push({
      position: p.position,
      probingDepthMm: p.probingDepthMm,
      bleeding: p.bleeding,
      suppuration: p.suppuration,
    });
    byExam.set(p.examId, list);
  }
  return rows.map((r) => ({
    ...r,
    sites: inChartOrder(byExam.get(r.id) ?? []),
    recordedAt: r.recordedAt.toISOString(),
    recordedAtDate: r.recordedAt,
  }));
}

export function toContract(row: ExamRow): RecallExam {
  const { practiceId: _p, recordedAtDate: _r, ...rest } = row;
  return rest;
}

/**
 * Latest current exam per site: the status and date for the Arch ring and the Site file
 * (served to the patients and sites features by MaintenanceStatusService).
 */
export async function latestExamBySite(
  db: Database,
  siteIds: string[],
): Promise<Map<string, { status: PeriImplantStatus; examinedOn: string }>> {
  if (siteIds.length === 0) return new Map();
  const rows = await latestExamBySiteQuery(db).execute({ siteIds });
  return new Map(rows.map((r) => [r.siteId, { status: r.status, examinedOn: r.examinedOn }]));
}
// The sites as one array parameter (`= any`), so one named statement serves any number of them
// (the Site file asks for one, the Arch for every site of the patient).
const latestExamBySiteQuery = preparedFor((db) =>
  db
    .selectDistinctOn([recallExams.siteId], {
      siteId: recallExams.siteId,
      status: recallExams.status,
      examinedOn: recallExams.examinedOn,
    })
    .from(recallExams)
    .where(and(sql`${recallExams.siteId} = any(${sql.placeholder('siteIds')}::uuid[])`, isCurrent))
    .orderBy(recallExams.siteId, desc(recallExams.examinedOn), desc(recallExams.recordedAt))
    .prepare('latest_exam_by_site'),
);

export async function findVisiblePatientForRecall(db: Db, scope: Scope, patientId: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      name: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      smoker: patients.smoker,
      diabetesPoorlyControlled: patients.diabetesPoorlyControlled,
      periodontitisHistory: patients.periodontitisHistory,
    })
    .from(patients)
    .where(and(eq(patients.id, patientId), visiblePatients(scope)));
  return row ?? null;
}

/** The patient's implant sites with the delivery date of their current restoration, if any. */
/** A patient's implant sites for the exam form; with `siteIds` (a share of chosen sites) only those. */
export async function listSitesForExam(db: Db, patientId: string, siteIds: readonly string[] | null = null) {
  return db
    .select({
      siteId: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      // Raw SQL: drizzle leaves columns unqualified in single-table selects, and "id" would be ambiguous here.
      deliveredOn: sql<
        string | null
      >`(select min(rr.delivered_on)::text from restoration_sites rs join restorations rr on rr.id = rs.restoration_id where rs.site_id = "implant_sites"."id" and rr.delivered_on is not null and rr.status <> 'removed')`,
    })
    .from(implantSites)
    .where(and(eq(implantSites.patientId, patientId), siteIds ? inArray(implantSites.id, [...siteIds]) : undefined))
    .orderBy(asc(implantSites.fdi));
}

export async function findVisibleSiteForRecall(db: Database, scope: Scope, siteId: string) {
  const [row] = await visibleSiteQuery(db).execute({ siteId, ...scopeParams(scope) });
  return row ?? null;
}
const visibleSiteQuery = preparedFor((db) =>
  db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
    })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, sql.placeholder('siteId')), visiblePatientsPrepared()))
    .prepare('exam_history_site'),
);

/** Any current exam of the patient computed as peri-implantitis (a recall risk factor). */
export async function hadPeriImplantitis(db: Db, patientId: string): Promise<boolean> {
  const [row] = await db
    .select({ found: sql<boolean>`true` })
    .from(recallExams)
    .where(and(eq(recallExams.patientId, patientId), eq(recallExams.status, 'peri-implantitis'), isCurrent))
    .limit(1);
  return Boolean(row);
}

export interface NewExam {
  practiceId: string;
  patientId: string;
  siteId: string;
  visitId: string;
  examinedOn: string;
  examinerId: string;
  mobility: boolean;
  plaqueIndex: number | null;
  bleedingIndex: number | null;
  keratinizedMucosaMm: number | null;
  residualCement: boolean;
  boneLevelMm: number | null;
  boneLevelMeasurementId: string | null;
  isBaseline: boolean;
  notes: string | null;
  status: PeriImplantStatus;
  reasons: string[];
  flags: string[];
  rulesVersion: string;
  ruleOptions: Record<string, number>;
  baselineExamId: string | null;
  sites: ProbedSite[];
}

export async function insertExam(db: Db, exam: NewExam): Promise<string> {
  const { sites, ...row } = exam;
  const [inserted] = await db.insert(recallExams).values(row).returning({ id: recallExams.id });
  await insertProbedSites(db, exam.practiceId, inserted.id, sites);
  return inserted.id;
}

/** A new version of an exam; a second amendment of one version is refused by the database. */
export async function insertExamAmendment(
  tx: Tx,
  exam: NewExam & { supersedesId: string; amendmentReason: string },
): Promise<string> {
  const { sites, ...row } = exam;
  const id = await insertAmendment(tx, recallExams, row);
  await insertProbedSites(tx, exam.practiceId, id, sites);
  return id;
}

async function insertProbedSites(db: Db, practiceId: string, examId: string, sites: ProbedSite[]) {
  await db.insert(recallExamSites).values(sites.map((s) => ({ practiceId, examId, ...s })));
}

/**
 * Serialises the exam history of one patient until the transaction ends: visits and amendments
 * read the earlier exams (baseline) and reschedule the one recall only after taking it, so two
 * saves cannot both schedule a recall or both compare with a history the other is changing.
 */
export async function lockExamHistory(tx: Tx, patientId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`recall-visit:${patientId}`}))`);
}

export async function findExamsByIds(db: Db, ids: string[]): Promise<ExamRow[]> {
  if (ids.length === 0) return [];
  const rows = await db
    .select(examColumns)
    .from(recallExams)
    .innerJoin(implantSites, eq(implantSites.id, recallExams.siteId))
    .innerJoin(users, eq(users.id, recallExams.examinerId))
    .where(inArray(recallExams.id, ids))
    .orderBy(asc(implantSites.fdi));
  return attachSites(db, rows);
}

/** Latest current exam date of a patient (any site). */
export async function latestExamDateOfPatient(db: Db, patientId: string): Promise<string | null> {
  const [row] = await db
    .select({ on: sql<string | null>`max(${recallExams.examinedOn})` })
    .from(recallExams)
    .where(and(eq(recallExams.patientId, patientId), isCurrent));
  return row?.on ?? null;
}

/** Replaces the patient's scheduled recall: earlier ones are done, one new recall is scheduled. */
export async function rescheduleRecall(
  db: Db,
  r: { practiceId: string; patientId: string; dueOn: string; visitId: string },
): Promise<void> {
  await db
    .update(recalls)
    .set({ status: 'done' })
    .where(and(eq(recalls.patientId, r.patientId), eq(recalls.status, 'scheduled')));
  await db.insert(recalls).values({
    practiceId: r.practiceId,
    patientId: r.patientId,
    dueOn: r.dueOn,
    status: 'scheduled',
    scheduledFromVisitId: r.visitId,
  });
}

export const DEFAULT_POLICY = {
  baseMonths: DEFAULT_RECALL_MONTHS,
  riskMonths: DEFAULT_RISK_RECALL_MONTHS,
  reminderDaysBefore: DEFAULT_REMINDER_DAYS_BEFORE,
  overdueReminderDaysAfter: DEFAULT_OVERDUE_REMINDER_DAYS_AFTER,
} as const;

export async function findPolicy(db: Db, practiceId: string) {
  const [row] = await db.select().from(recallPolicies).where(eq(recallPolicies.practiceId, practiceId));
  return row
    ? {
        baseMonths: row.baseMonths,
        riskMonths: row.riskMonths,
        reminderDaysBefore: row.reminderDaysBefore,
        overdueReminderDaysAfter: row.overdueReminderDaysAfter,
        isDefault: false,
        updatedAt: row.updatedAt.toISOString(),
      }
    : { ...DEFAULT_POLICY, isDefault: true, updatedAt: null };
}

export async function upsertPolicy(
  db: Db,
  practiceId: string,
  userId: string,
  p: { baseMonths: number; riskMonths: number; reminderDaysBefore: number; overdueReminderDaysAfter: number },
) {
  await db
    .insert(recallPolicies)
    .values({ practiceId, ...p, updatedBy: userId, updatedAt: new Date() })
    .onConflictDoUpdate({ target: recallPolicies.practiceId, set: { ...p, updatedBy: userId, updatedAt: new Date() } });
}

/** One exam with its scope, if the user may see its patient; `superseded` when already amended. */
export async function findVisibleExam(db: Db, scope: Scope, examId: string) {
  const [row] = await db
    .select({
      id: recallExams.id,
      practiceId: recallExams.practiceId,
      patientId: recallExams.patientId,
      siteId: recallExams.siteId,
      visitId: recallExams.visitId,
      examinedOn: recallExams.examinedOn,
      // What an amendment may leave out and keep.
      plaqueIndex: recallExams.plaqueIndex,
      bleedingIndex: recallExams.bleedingIndex,
      keratinizedMucosaMm: recallExams.keratinizedMucosaMm,
      residualCement: recallExams.residualCement,
      boneLevelMm: recallExams.boneLevelMm,
      boneLevelMeasurementId: recallExams.boneLevelMeasurementId,
      isBaseline: recallExams.isBaseline,
      notes: recallExams.notes,
      superseded: isAmended(recallExams),
    })
    .from(recallExams)
    .innerJoin(patients, eq(patients.id, recallExams.patientId))
    .where(and(eq(recallExams.id, examId), visiblePatients(scope)));
  return row ?? null;
}
