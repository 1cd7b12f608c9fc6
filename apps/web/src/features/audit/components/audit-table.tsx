import { HTMLTable, Tag } from '@blueprintjs/core';
import type { AuditEvent } from '@torquetrail/contracts';
import { formatDateTime } from '../../../lib/dates';
import { AUDIT_ACTION_LABEL, AUDIT_OUTCOME_LABEL, ROLE_LABEL } from '../../../lib/labels';
import { ChartNumber } from '../../../lib/components/chart-number';

/** What a row was about, in words: the route as declared is plain enough for an administrator. */
const about = (e: AuditEvent) => [e.recordType, e.route].filter(Boolean).join(' · ');

/** Rows of the audit trail, newest first; the patient column is left out on a patient's own page. */
export function AuditTable({ items, showPatient }: { items: AuditEvent[]; showPatient: boolean }) {
  return (
    <HTMLTable striped compact className="audit-table" data-testid="audit-table">
      <thead>
        <tr>
          <th>When</th>
          <th>Who</th>
          <th>What</th>
          {showPatient && <th>Patient</th>}
          <th>Record</th>
          <th>From</th>
        </tr>
      </thead>
      <tbody>
        {items.map((e) => (
          <tr key={e.id} data-testid="audit-row">
            <td>{formatDateTime(e.at)}</td>
            <td>
              {e.userName ?? 'Unknown account'}
              {e.role && <span className="muted"> · {ROLE_LABEL[e.role]}</span>}
            </td>
            <td>
              {AUDIT_ACTION_LABEL[e.action]}{' '}
              {e.outcome !== 'allowed' && (
                <Tag minimal intent="danger">
                  {AUDIT_OUTCOME_LABEL[e.outcome].toLowerCase()}
                  {e.httpStatus ? ` (${e.httpStatus})` : ''}
                </Tag>
              )}
            </td>
            {showPatient && (
              <td>
                {e.patientName ? (
                  <>
                    {e.patientName} (<ChartNumber value={e.chartNumber ?? ''} />)
                  </>
                ) : (
                  '—'
                )}
              </td>
            )}
            <td className="audit-table__record">{about(e) || '—'}</td>
            <td className="audit-table__from" title={e.userAgent ?? undefined}>
              {e.address ?? '—'}
            </td>
          </tr>
        ))}
      </tbody>
    </HTMLTable>
  );
}
