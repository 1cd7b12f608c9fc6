// The one place a patient's next recall is scheduled after exams: a visit entered in the app and
// the exams a legacy import brings in follow the same domain rule (nextRecallDate) and policy.
import { Injectable } from '@nestjs/common';
import { nextRecallDate, recallIntervalMonths } from '@torquetrail/domain';
import type { Tx } from '../db/database.js';
import { findPolicy, hadPeriImplantitis, latestExamDateOfPatient, rescheduleRecall } from './exams.repository.js';
import { RecallClock } from './recall-clock.js';
import { findPatientRisk } from './recall-schedule.repository.js';

export interface RecallRiskPatient {
  id: string;
  practiceId: string;
  smoker: boolean;
  diabetesPoorlyControlled: boolean;
  periodontitisHistory: boolean;
}

@Injectable()
export class RecallScheduler {
  constructor(private readonly clock: RecallClock) {}

  /**
   * The patient's next recall from their latest exam: nextRecallDate with the patient's risk
   * factors and the practice policy. Decision: peri-implantitis found in this visit counts as
   * "prior" for the interval that starts today.
   */
  async reschedule(tx: Tx, patient: RecallRiskPatient, visitId: string, periImplantitisNow: boolean) {
    const riskFactors = {
      smoker: patient.smoker,
      diabetesPoorlyControlled: patient.diabetesPoorlyControlled,
      periodontitisHistory: patient.periodontitisHistory,
      priorPeriImplantitis: periImplantitisNow || (await hadPeriImplantitis(tx, patient.id)),
    };
    const policy = await findPolicy(tx, patient.practiceId);
    const lastExam = (await latestExamDateOfPatient(tx, patient.id)) ?? this.clock.today();
    const intervals = { baseMonths: policy.baseMonths, riskMonths: policy.riskMonths };
    const dueOn = nextRecallDate(lastExam, riskFactors, intervals);
    await rescheduleRecall(tx, { practiceId: patient.practiceId, patientId: patient.id, dueOn, visitId });
    return { dueOn, intervalMonths: recallIntervalMonths(riskFactors, intervals), riskFactors };
  }

  /**
   * After imported exams (already written in `tx`): the same rule as a visit entered in the app,
   * from the patient's latest exam; peri-implantitis among the imported exams counts as prior.
   */
  async rescheduleAfterImport(tx: Tx, patientId: string, visitId: string): Promise<void> {
    await this.reschedule(tx, await findPatientRisk(tx, patientId), visitId, false);
  }
}
