import '../components/shares.css';
import { NonIdealState } from '@blueprintjs/core';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { usePracticeShares } from '../api/shares-api';
import { SharesTable } from '../components/shares-table';

/** /practice/shares: every share of the practice's patients, active, ended and revoked. */
export function PracticeSharesRoute() {
  const shares = usePracticeShares();
  return (
    <div className="shares">
      <title>Shares · Practice · Torquetrail</title>
      <h1 className="page-title">Shares</h1>
      <p className="muted">
        Patients opened to referring surgeons of other practices. Share a patient from the patient&apos;s page.
      </p>
      {shares.isPending ? (
        <LoadingState label="Loading the shares" />
      ) : shares.isError ? (
        <ErrorState title="Could not load the shares" error={shares.error} onRetry={() => void shares.refetch()} />
      ) : shares.data.items.length === 0 ? (
        <NonIdealState icon="people" title="No shares" description="No patient is shared with another practice." />
      ) : (
        <SharesTable shares={shares.data.items} showPatient />
      )}
    </div>
  );
}
