import '../components/audit.css';
import { AnchorButton, Button, FormGroup, HTMLSelect, NonIdealState } from '@blueprintjs/core';
import { AUDIT_ACTIONS, type AuditAction } from '@torquetrail/contracts';
import { useSearchParams } from 'react-router-dom';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { AUDIT_ACTION_LABEL, ROLE_LABEL } from '../../../lib/labels';
import { auditSearch, usePatientChoices, usePracticeAudit } from '../api/audit-api';
import type { AuditFilters } from '../api/keys';
import { AuditTable } from '../components/audit-table';
import { ChartNumber } from '../../../lib/components/chart-number';
import { DateInput } from '../../../lib/components/date-input';

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** /practice/audit: who read, exported or changed what, filtered by patient, user, action and dates (practice admin). */
export function AuditRoute() {
  const [url, setUrl] = useSearchParams();
  const day = (key: string) => (ISO_DAY.test(url.get(key) ?? '') ? (url.get(key) ?? undefined) : undefined);
  const action = url.get('action');
  const filters: AuditFilters = {
    patientId: url.get('patientId') || undefined,
    userId: url.get('userId') || undefined,
    action: (AUDIT_ACTIONS as readonly string[]).includes(action ?? '') ? (action as AuditAction) : undefined,
    from: day('from'),
    to: day('to'),
  };
  const trail = usePracticeAudit(filters);
  const patients = usePatientChoices();
  const set = (key: keyof AuditFilters, value: string) => {
    const next = new URLSearchParams(url);
    if (value) next.set(key, value);
    else next.delete(key);
    setUrl(next, { replace: true });
  };
  const people = trail.data?.pages[0]?.people ?? [];
  const items = trail.data?.pages.flatMap((p) => p.items) ?? [];

  return (
    <div className="audit-page">
      <title>Audit trail · Practice · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Practice' }, { text: 'Audit trail' }]} />
      <h1 className="page-title">Audit trail</h1>
      <p>Every opening of patient data, every download and every change, with who, when and from where.</p>
      <form
        className="audit-page__filters"
        role="search"
        aria-label="Filter the audit trail"
        onSubmit={(e) => e.preventDefault()}
      >
        <FormGroup label="Patient" labelFor="audit-patient">
          <HTMLSelect
            id="audit-patient"
            value={filters.patientId ?? ''}
            onChange={(e) => set('patientId', e.currentTarget.value)}
          >
            <option value="">All patients</option>
            {patients.data?.items.map((p) => (
              <option key={p.id} value={p.id}>
                {p.familyName}, {p.givenName} (<ChartNumber value={p.chartNumber} />)
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup label="User" labelFor="audit-user">
          <HTMLSelect
            id="audit-user"
            value={filters.userId ?? ''}
            onChange={(e) => set('userId', e.currentTarget.value)}
          >
            <option value="">Everyone</option>
            {people.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name} ({ROLE_LABEL[p.role]})
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup label="Action" labelFor="audit-action">
          <HTMLSelect
            id="audit-action"
            value={filters.action ?? ''}
            onChange={(e) => set('action', e.currentTarget.value)}
          >
            <option value="">Any action</option>
            {AUDIT_ACTIONS.map((a) => (
              <option key={a} value={a}>
                {AUDIT_ACTION_LABEL[a]}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup label="From" labelFor="audit-from" helperText="Day, UTC">
          <DateInput id="audit-from" value={filters.from ?? ''} onChange={(v) => set('from', v)} />
        </FormGroup>
        <FormGroup label="To" labelFor="audit-to" helperText="Included">
          <DateInput id="audit-to" value={filters.to ?? ''} onChange={(v) => set('to', v)} />
        </FormGroup>
        <FormGroup>
          <AnchorButton icon="download" href={`/api/audit/csv${auditSearch(filters)}`} download="audit-trail.csv">
            Export CSV
          </AnchorButton>
        </FormGroup>
      </form>
      {trail.isPending ? (
        <LoadingState label="Loading the audit trail" />
      ) : trail.isError ? (
        <ErrorState title="Could not load the audit trail" error={trail.error} onRetry={() => void trail.refetch()} />
      ) : items.length === 0 ? (
        <NonIdealState icon="history" title="Nothing recorded" description="No event matches these filters." />
      ) : (
        <div aria-busy={trail.isFetching}>
          <AuditTable items={items} showPatient />
          {trail.hasNextPage && (
            <Button loading={trail.isFetchingNextPage} onClick={() => void trail.fetchNextPage()}>
              Show older
            </Button>
          )}
        </div>
      )}
    </div>
  );
}
