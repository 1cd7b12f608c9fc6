import './shares.css';
import { NonIdealState } from '@blueprintjs/core';
import { type ArchSite } from '@torquetrail/contracts';
import { subject } from '@torquetrail/authz';
import { Can } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { usePatientShares } from '../api/shares-api';
import { ShareForm } from './share-form';
import { SharesTable } from './shares-table';

/** The patient's Shares section: who outside the practice sees this patient, and a form to share. */
export function PatientShares({
  patient,
}: {
  patient: { id: string; practiceId: string; sites: readonly ArchSite[] };
}) {
  const shares = usePatientShares(patient.id);
  return (
    <section className="shares-section" aria-labelledby="shares-heading">
      <h2 id="shares-heading">Shares</h2>
      {shares.isPending ? (
        <LoadingState label="Loading the shares" />
      ) : shares.isError ? (
        <ErrorState title="Could not load the shares" error={shares.error} onRetry={() => void shares.refetch()} />
      ) : shares.data.items.length === 0 ? (
        <NonIdealState
          icon="people"
          title="Not shared"
          description="No surgeon of another practice sees this patient."
        />
      ) : (
        <SharesTable shares={shares.data.items} showPatient={false} />
      )}
      <Can I="create" this={subject('Share', { practiceId: patient.practiceId, patientId: patient.id })}>
        <h3>Share with a surgeon of another practice</h3>
        <ShareForm patientId={patient.id} sites={patient.sites} />
      </Can>
    </section>
  );
}
