import { Tag } from '@blueprintjs/core';
import type { PatientDetail } from '@torquetrail/contracts';
import { RECALL_RISK_FACTORS } from '@torquetrail/domain';
import { RISK_FACTOR_LABEL } from '../../../lib/clinical-labels';
import { ageInYears, formatDate } from '../../../lib/dates';
import { ChartNumber } from '../../../lib/components/chart-number';

type PatientRisk = keyof NonNullable<PatientDetail['riskFactors']>;
const isPatientRisk = (factor: string): factor is PatientRisk => factor !== 'priorPeriImplantitis';

export function PatientHeader({ patient }: { patient: PatientDetail }) {
  // The patient's own risk factors; prior peri-implantitis is derived from exams, shown on the Recall desk.
  // A shared surgeon's reply has none (least privilege): the row is left out, not shown as "none".
  const recorded = patient.riskFactors;
  const risks = recorded ? RECALL_RISK_FACTORS.filter(isPatientRisk).filter((key) => recorded[key]) : [];
  return (
    <header className="patient-header">
      <h1 className="page-title">
        {patient.givenName} {patient.familyName}
      </h1>
      <dl className="fact-row">
        <div>
          <dt>Chart no.</dt>
          <dd>
            <ChartNumber value={patient.chartNumber} />
          </dd>
        </div>
        <div>
          <dt>Born</dt>
          <dd>
            {formatDate(patient.birthDate)} (age {ageInYears(patient.birthDate)})
          </dd>
        </div>
        <div>
          <dt>Practice</dt>
          <dd>{patient.practiceName}</dd>
        </div>
        {recorded && (
          <div data-testid="patient-risk-factors">
            <dt>Risk factors</dt>
            <dd className="tag-list">
              {risks.length === 0 ? (
                <span className="muted">None recorded</span>
              ) : (
                risks.map((key) => (
                  <Tag key={key} intent="warning" minimal icon="warning-sign">
                    {RISK_FACTOR_LABEL[key]}
                  </Tag>
                ))
              )}
            </dd>
          </div>
        )}
      </dl>
    </header>
  );
}
