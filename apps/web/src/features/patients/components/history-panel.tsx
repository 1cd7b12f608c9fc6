import { HTMLTable, NonIdealState } from '@blueprintjs/core';
import {
  PATIENT_SEXES,
  PREFERRED_LANGUAGES,
  type PatientSex,
  type PatientVersion,
  type PatientVersionField,
  type PreferredLanguage,
} from '@torquetrail/contracts';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDateTime } from '../../../lib/dates';
import {
  PATIENT_FIELD_LABEL,
  PATIENT_SEX_LABEL,
  PATIENT_VERSION_KIND_LABEL,
  PREFERRED_LANGUAGE_LABEL,
} from '../../../lib/labels';
import { usePatientVersions } from '../api/patient-records';
import { ChartNumber } from '../../../lib/components/chart-number';

type Stored = PatientVersion['changes'][number]['before'];

/** A stored value in words: yes/no, "not given", the enums' labels. */
function shown(field: string, value: Stored): string {
  if (value === null || value === '') return 'not given';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (field === 'sex' && (PATIENT_SEXES as readonly unknown[]).includes(value))
    return PATIENT_SEX_LABEL[value as PatientSex];
  if (field === 'preferredLanguage' && (PREFERRED_LANGUAGES as readonly unknown[]).includes(value))
    return PREFERRED_LANGUAGE_LABEL[value as PreferredLanguage];
  return String(value);
}
/** A stored value as shown in the History; a chart number never wraps. */
const valueOf = (field: string, value: Stored) =>
  field === 'chartNumber' && typeof value === 'string' && value !== '' ? (
    <ChartNumber value={value} />
  ) : (
    shown(field, value)
  );
const fieldLabel = (field: string) => PATIENT_FIELD_LABEL[field as PatientVersionField] ?? field;

/** Who changed what and when, oldest first (dentist and practice admin). */
export function HistoryPanel({ patientId }: { patientId: string }) {
  const versions = usePatientVersions(patientId);
  if (versions.isPending) return <LoadingState label="Loading the history" />;
  if (versions.isError)
    return (
      <ErrorState title="Could not load the history" error={versions.error} onRetry={() => void versions.refetch()} />
    );
  if (versions.data.items.length === 0)
    return <NonIdealState icon="history" title="No history yet" description="Changes to the record appear here." />;
  return (
    <div className="table-scroll">
      <HTMLTable compact striped className="history-table" data-testid="patient-history">
        <caption className="visually-hidden">Versions of the patient&apos;s record</caption>
        <thead>
          <tr>
            <th scope="col">Version</th>
            <th scope="col">When</th>
            <th scope="col">Who</th>
            <th scope="col">What</th>
            <th scope="col">Changes</th>
          </tr>
        </thead>
        <tbody>
          {[...versions.data.items].reverse().map((v) => (
            <tr key={v.version}>
              <td className="numeric">{v.version}</td>
              <td>{formatDateTime(v.changedAt)}</td>
              <td>{v.changedByName}</td>
              <td>
                {PATIENT_VERSION_KIND_LABEL[v.kind]}
                {v.reason ? `: ${v.reason}` : ''}
              </td>
              <td>
                <ul className="history-change">
                  {v.changes
                    .filter((c) => v.kind !== 'created' || (c.after !== null && c.after !== false))
                    .map((c) => (
                      <li key={c.field}>
                        {fieldLabel(c.field)}:{' '}
                        {v.kind === 'created' ? (
                          valueOf(c.field, c.after)
                        ) : (
                          <>
                            <del>{valueOf(c.field, c.before)}</del> → <ins>{valueOf(c.field, c.after)}</ins>
                          </>
                        )}
                      </li>
                    ))}
                </ul>
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}
