import { Tag } from '@blueprintjs/core';
import type { PatientDetail } from '@torquetrail/contracts';
import { ageInYears, formatDate } from '../../../lib/dates';

const RISK_LABEL: Record<keyof PatientDetail['riskFactors'], string> = {
  smoker: 'Smoker',
  diabetesPoorlyControlled: 'Poorly controlled diabetes',
  periodontitisHistory: 'History of periodontitis',
};

export function PatientHeader({ patient }: { patient: PatientDetail }) {
  const risks = (Object.keys(RISK_LABEL) as (keyof typeof RISK_LABEL)[]).filter((key) => patient.riskFactors[key]);
  return (
    <header className="patient-header">
      <h1 className="page-title">
        {patient.givenName} {patient.familyName}
      </h1>
      <dl className="fact-row">
        <div>
          <dt>Chart no.</dt>
          <dd className="mono">{patient.chartNumber}</dd>
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
        <div>
          <dt>Risk factors</dt>
          <dd className="tag-list">
            {risks.length === 0 ? (
              <span className="muted">None recorded</span>
            ) : (
              risks.map((key) => (
                <Tag key={key} intent="warning" minimal icon="warning-sign">
                  {RISK_LABEL[key]}
                </Tag>
              ))
            )}
          </dd>
        </div>
      </dl>
    </header>
  );
}
