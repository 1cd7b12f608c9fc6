import { HTMLTable, Tag } from '@blueprintjs/core';
import type { PatientListItem } from '@torquetrail/contracts';
import { Link } from 'react-router-dom';
import { ageInYears, formatDate } from '../../../lib/dates';
import { ChartNumber } from '../../../lib/components/chart-number';
import { SHARE_SCOPE_LABEL } from '../../../lib/labels';

/** Patients, one row each; the name is the row's link (mouse and keyboard). */
export function PatientsTable({ patients }: { patients: readonly PatientListItem[] }) {
  // A surgeon's shared patients name what the share opens; a practice's own list has no such column.
  const shared = patients.some((p) => p.shareScopes !== null);
  return (
    <div className="table-scroll">
      <HTMLTable striped compact interactive className="patients-table" data-testid="patients-table">
        <caption className="visually-hidden">Patients</caption>
        <thead>
          <tr>
            <th scope="col">Chart no.</th>
            <th scope="col">Name</th>
            <th scope="col">Birth date (age)</th>
            <th scope="col" className="numeric">
              Implant sites
            </th>
            <th scope="col">Practice</th>
            {shared && <th scope="col">Shared for</th>}
          </tr>
        </thead>
        <tbody>
          {patients.map((patient) => (
            <tr key={patient.id}>
              <td>
                <ChartNumber value={patient.chartNumber} />
              </td>
              <th scope="row">
                <Link to={`/patients/${patient.id}`} className="row-link">
                  {patient.familyName}, {patient.givenName}
                </Link>
                {patient.archivedAt && (
                  <Tag minimal className="archived-tag">
                    archived
                  </Tag>
                )}
              </th>
              <td>
                {formatDate(patient.birthDate)} ({ageInYears(patient.birthDate)})
              </td>
              <td className="numeric">{patient.implantSiteCount}</td>
              <td>{patient.practiceName}</td>
              {shared && (
                <td data-testid="share-scopes">
                  {patient.shareScopes === null
                    ? 'Own practice'
                    : patient.shareScopes.map((scope) => SHARE_SCOPE_LABEL[scope]).join(' and ')}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}
