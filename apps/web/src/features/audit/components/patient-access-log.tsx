import './audit.css';
import { Button, NonIdealState } from '@blueprintjs/core';
import { useState } from 'react';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { usePatientAudit } from '../api/audit-api';
import { AuditTable } from './audit-table';

/**
 * "Who accessed this record" on a patient's page (dentist and practice admin). Loaded on request:
 * looking at the trail is itself recorded, so it is not fetched with every opening of the patient.
 */
export function PatientAccessLog({ patientId }: { patientId: string }) {
  const [open, setOpen] = useState(false);
  const log = usePatientAudit(patientId, open);
  const items = log.data?.pages.flatMap((p) => p.items) ?? [];
  return (
    <section className="patient-access-log" aria-labelledby="access-log-heading">
      <h2 id="access-log-heading">Who accessed this record</h2>
      {!open ? (
        <Button icon="history" onClick={() => setOpen(true)} data-testid="show-access-log">
          Show who opened, downloaded or changed this record
        </Button>
      ) : log.isPending ? (
        <LoadingState label="Loading who accessed this record" />
      ) : log.isError ? (
        <ErrorState title="Could not load the record's trail" error={log.error} onRetry={() => void log.refetch()} />
      ) : items.length === 0 ? (
        <NonIdealState icon="history" title="Nothing recorded yet" />
      ) : (
        <>
          <AuditTable items={items} showPatient={false} />
          {log.hasNextPage && (
            <Button loading={log.isFetchingNextPage} onClick={() => void log.fetchNextPage()}>
              Show older
            </Button>
          )}
        </>
      )}
    </section>
  );
}
