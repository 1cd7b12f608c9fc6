import { randomUUID } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  AmendExamBody as AmendExamSchema,
  CreateVisitBody as CreateVisitSchema,
  type CreateVisitReply,
  type RecallExam,
  type ExamContext,
  type SiteBoneLevel,
  type SiteExamHistory,
} from '@torquetrail/contracts';
import {
  choosePeriImplantBaseline,
  classifyPeriImplant,
  DEFAULT_BONE_LOSS_MM,
  DEFAULT_PD_INCREASE_MM,
  boneLevelOfferFor,
  DomainError,
  inChartOrder,
  latestExam,
  RULES_VERSION,
  toPeriImplantBaseline,
  toPeriImplantExam,
} from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { asSiteRow, assertCan, assertCanList, type Scope, sharedSitesOf } from '../authz/scope.js';
import { keepAbsent } from '../common/keep-absent.js';
import { alreadyAmended } from '../common/amendment-conflict.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { datePrinter } from '../common/printed-dates.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { BoneLevelsService } from '../radiographs/bone-levels.service.js';
import {
  findExamsByIds,
  findPolicy,
  findVisibleExam,
  findVisiblePatientForRecall,
  findVisibleSiteForRecall,
  hadPeriImplantitis,
  insertExam,
  insertExamAmendment,
  listExamsOfSite,
  listExamsOfSites,
  listSitesForExam,
  lockExamHistory,
  toContract,
} from './exams.repository.js';
import { RecallClock } from './recall-clock.js';
import { RecallScheduler } from './recall-scheduler.service.js';

const EXAMINABLE = new Set(['placed', 'restored']);
/** The thresholds handed to classifyPeriImplant, stored beside each verdict. */
const RULE_OPTIONS = { pdIncreaseMm: DEFAULT_PD_INCREASE_MM, boneLossMm: DEFAULT_BONE_LOSS_MM };

@Injectable()
export class ExamsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly clock: RecallClock,
    private readonly boneLevels: BoneLevelsService,
    private readonly scheduler: RecallScheduler,
  ) {}

  async context(ability: AppAbility, scope: Scope, patientId: string): Promise<ExamContext> {
    const patient = assertCanList(
      ability,
      scope,
      'RecallExam',
      await findVisiblePatientForRecall(this.db, scope, patientId),
    );
    const [sites, policy, prior] = await Promise.all([
      listSitesForExam(this.db, patient.id, sharedSitesOf(scope, patient.id)),
      findPolicy(this.db, patient.practiceId),
      hadPeriImplantitis(this.db, patient.id),
    ]);
    const exams = await listExamsOfSites(
      this.db,
      sites.map((s) => s.siteId),
    );
    const measured = await this.boneLevels.bySite(sites.map((s) => s.siteId));
    const today = this.clock.today();
    return {
      patient: {
        id: patient.id,
        chartNumber: patient.chartNumber,
        name: patient.name,
        riskFactors: {
          smoker: patient.smoker,
          diabetesPoorlyControlled: patient.diabetesPoorlyControlled,
          periodontitisHistory: patient.periodontitisHistory,
          priorPeriImplantitis: prior,
        },
      },
      today,
      policy: ability.can('read', subject('RecallPolicy', { practiceId: patient.practiceId })) ? policy : null,
      sites: sites.map((s) => {
        const mine = exams.filter((e) => e.siteId === s.siteId);
        const baseline = choosePeriImplantBaseline(mine, { examinedOn: today, isBaseline: false }, s.deliveredOn);
        const previous = latestExam(mine);
        return {
          siteId: s.siteId,
          fdi: s.fdi,
          status: s.status,
          examinable: EXAMINABLE.has(s.status),
          deliveredOn: s.deliveredOn,
          baseline: baseline ? toContract(baseline) : null,
          previous: previous ? toContract(previous) : null,
          measuredBoneLevels: (measured.get(s.siteId) ?? []).map(offered),
        };
      }),
    };
  }

  async history(ability: AppAbility, scope: Scope, siteId: string): Promise<SiteExamHistory> {
    const site = assertCan(
      ability,
      'read',
      'RecallExam',
      asSiteRow(await findVisibleSiteForRecall(this.db, scope, siteId)),
      'implant site',
    );
    const exams = await listExamsOfSite(this.db, site.id);
    return { siteId: site.id, fdi: site.fdi, patientId: site.patientId, exams: exams.map(toContract) };
  }

  /**
   * One visit, in one transaction: every exam is classified on the server with
   * classifyPeriImplant (the client's status is never trusted), stored with RULES_VERSION and the
   * options used, and the patient's next recall is scheduled with nextRecallDate.
   */
  async createVisit(
    ability: AppAbility,
    scope: Scope,
    examiner: SessionUser,
    body: z.infer<typeof CreateVisitSchema>,
  ): Promise<CreateVisitReply> {
    const patient = assertCan(
      ability,
      'create',
      'RecallExam',
      await findVisiblePatientForRecall(this.db, scope, body.patientId).then((p) =>
        p ? { ...p, patientId: p.id } : null,
      ),
      'patient',
    );
    if (body.examinedOn > this.clock.today()) throw fieldError({ examinedOn: 'an exam cannot be dated in the future' });

    return auditedTransaction(this.db, async (tx) => {
      // A visit is several exams: the audit row names the patient, the visit's first exam and the whole body.
      reportChange({ type: 'RecallExam', patientId: patient.id, after: body });
      // Serialise visits of one patient before reading their history, so two saves cannot both
      // schedule a recall or choose a baseline from exams the other is adding.
      await lockExamHistory(tx, patient.id);
      const sites = new Map((await listSitesForExam(tx, patient.id)).map((s) => [s.siteId, s]));
      body.exams.forEach((exam, i) => {
        const site = sites.get(exam.siteId);
        if (!site) throw fieldError({ [`exams.${i}.siteId`]: 'not an implant site of this patient' });
        if (!EXAMINABLE.has(site.status))
          throw fieldError({
            [`exams.${i}.siteId`]: `the implant at ${site.fdi} is ${site.status}: only placed or restored implants are examined`,
          });
      });
      const earlier = await listExamsOfSites(
        tx,
        body.exams.map((e) => e.siteId),
      );
      for (const [i, exam] of body.exams.entries()) {
        await this.checkBoneLevelSource(exam, exam.siteId, body.examinedOn, `exams.${i}.`, examiner);
      }

      const visitId = randomUUID();
      const ids: string[] = [];
      let anyPeriImplantitis = false;
      for (const [i, exam] of body.exams.entries()) {
        const site = sites.get(exam.siteId)!;
        const probes = inChartOrder(exam.sites);
        const baseline = choosePeriImplantBaseline(
          earlier.filter((e) => e.siteId === site.siteId),
          { examinedOn: body.examinedOn, isBaseline: exam.isBaseline },
          site.deliveredOn,
        );
        let verdict;
        try {
          verdict = classifyPeriImplant(
            toPeriImplantExam({ sites: probes, boneLevelMm: exam.boneLevelMm }),
            toPeriImplantBaseline(exam, baseline),
            RULE_OPTIONS,
          );
        } catch (error) {
          if (error instanceof DomainError) throw fieldError({ [`exams.${i}`]: error.message });
          throw error;
        }
        anyPeriImplantitis ||= verdict.status === 'peri-implantitis';
        ids.push(
          await insertExam(tx, {
            practiceId: patient.practiceId,
            patientId: patient.id,
            siteId: site.siteId,
            visitId,
            examinedOn: body.examinedOn,
            examinerId: examiner.id,
            mobility: exam.mobility,
            plaqueIndex: exam.plaqueIndex,
            bleedingIndex: exam.bleedingIndex,
            keratinizedMucosaMm: exam.keratinizedMucosaMm,
            residualCement: exam.residualCement,
            boneLevelMm: exam.boneLevelMm,
            boneLevelMeasurementId: exam.boneLevelMeasurementId,
            isBaseline: exam.isBaseline,
            notes: exam.notes || null,
            status: verdict.status,
            reasons: verdict.reasons,
            flags: verdict.flags,
            rulesVersion: RULES_VERSION,
            ruleOptions: RULE_OPTIONS,
            baselineExamId: baseline?.id ?? null,
            sites: probes,
          }),
        );
      }

      reportChange({ type: 'RecallExam', id: ids[0] });
      const nextRecall = await this.scheduler.reschedule(tx, patient, visitId, anyPeriImplantitis);
      return {
        visitId,
        exams: (await findExamsByIds(tx, ids)).map(toContract),
        nextRecall,
      };
    });
  }

  /** An amendment: a new exam superseding the old one, with the reason; recomputed and rescheduled in one transaction. */
  async amend(
    ability: AppAbility,
    scope: Scope,
    examiner: SessionUser,
    examId: string,
    body: z.infer<typeof AmendExamSchema>,
  ): Promise<RecallExam> {
    const old = assertCan(ability, 'amend', 'RecallExam', await findVisibleExam(this.db, scope, examId), 'exam');
    if (old.superseded) throw alreadyAmended('recall_exams');
    // What the amendment leaves out stays as it was.
    const next = keepAbsent(AmendExamSchema, body, old);
    // The source belongs to the value it gave: a bone level typed anew without one has none.
    if (body.boneLevelMm !== undefined && body.boneLevelMeasurementId === undefined) next.boneLevelMeasurementId = null;
    const patient = await findVisiblePatientForRecall(this.db, scope, old.patientId);
    return auditedTransaction(this.db, async (tx) => {
      reportChange({ type: 'RecallExam', patientId: old.patientId, before: old, after: body });
      // The history lock keeps the rescheduling to one at a time; of two amendments of one exam
      // the unique index on supersedes_id saves the first (insertExamAmendment).
      await lockExamHistory(tx, patient.id);
      const site = (await listSitesForExam(tx, patient.id)).find((s) => s.siteId === old.siteId)!;
      await this.checkBoneLevelSource(next, old.siteId, old.examinedOn, '', examiner);
      const earlier = (await listExamsOfSites(tx, [site.siteId])).filter((e) => e.id !== old.id);
      const probes = inChartOrder(next.sites);
      const baseline = choosePeriImplantBaseline(
        earlier,
        { examinedOn: old.examinedOn, isBaseline: next.isBaseline },
        site.deliveredOn,
      );
      let verdict;
      try {
        verdict = classifyPeriImplant(
          toPeriImplantExam({ sites: probes, boneLevelMm: next.boneLevelMm }),
          toPeriImplantBaseline(next, baseline),
          RULE_OPTIONS,
        );
      } catch (error) {
        if (error instanceof DomainError) throw fieldError({ sites: error.message });
        throw error;
      }
      const id = await insertExamAmendment(tx, {
        practiceId: old.practiceId,
        patientId: old.patientId,
        siteId: old.siteId,
        visitId: old.visitId,
        examinedOn: old.examinedOn,
        examinerId: examiner.id,
        mobility: next.mobility,
        plaqueIndex: next.plaqueIndex,
        bleedingIndex: next.bleedingIndex,
        keratinizedMucosaMm: next.keratinizedMucosaMm,
        residualCement: next.residualCement,
        boneLevelMm: next.boneLevelMm,
        boneLevelMeasurementId: next.boneLevelMeasurementId,
        isBaseline: next.isBaseline,
        notes: next.notes || null,
        status: verdict.status,
        reasons: verdict.reasons,
        flags: verdict.flags,
        rulesVersion: RULES_VERSION,
        ruleOptions: RULE_OPTIONS,
        baselineExamId: baseline?.id ?? null,
        sites: probes,
        supersedesId: old.id,
        amendmentReason: body.amendmentReason,
      });
      reportChange({ type: 'RecallExam', id });
      await this.scheduler.reschedule(tx, patient, old.visitId, false);
      return toContract((await findExamsByIds(tx, [id]))[0]);
    });
  }

  /**
   * A bone level accepted from a measurement names it: the measurement must be a current one of the
   * same site, on a radiograph not entered in error, describing the bone on or before the exam's
   * day (`boneLevelOfferFor`: a back-dated exam cannot cite a later film), and the value must be
   * the one it offers (a typed-over value is sent without a source).
   */
  private async checkBoneLevelSource(
    exam: { boneLevelMm: number | null; boneLevelMeasurementId: string | null },
    siteId: string,
    examinedOn: string,
    prefix: string,
    user: SessionUser,
  ) {
    if (exam.boneLevelMeasurementId === null) return;
    const source = await this.boneLevels.currentOfSite(exam.boneLevelMeasurementId, siteId);
    if (!source) {
      throw fieldError({
        [`${prefix}boneLevelMeasurementId`]: 'not a current bone-level measurement of this implant',
      });
    }
    if (boneLevelOfferFor([source], examinedOn) === null) {
      throw fieldError({
        [`${prefix}boneLevelMeasurementId`]: `the radiograph was taken after this exam of ${datePrinter(user.dateFormat).date(examinedOn)}; use a measurement of that day or earlier`,
      });
    }
    if (exam.boneLevelMm !== source.examBoneLevelMm) {
      throw fieldError({
        [`${prefix}boneLevelMm`]: `the measurement gives ${source.examBoneLevelMm} mm; a different value is typed, without a source`,
      });
    }
  }
}

/** A measurement as the exam form may offer it. */
function offered(m: SiteBoneLevel): ExamContext['sites'][number]['measuredBoneLevels'][number] {
  return {
    measurementId: m.measurementId,
    radiographId: m.radiographId,
    boneLevelMm: m.examBoneLevelMm,
    mesialMm: m.mesialMm,
    distalMm: m.distalMm,
    takenOn: m.takenOn,
    measuredAt: m.measuredAt,
    measuredBy: m.measuredBy,
  };
}
