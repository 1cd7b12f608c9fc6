import '../components/planner.css';
import { Classes, NonIdealState } from '@blueprintjs/core';
import { Link, useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useToothSystem } from '../../../lib/tooth-system';
import { useRestorations } from '../api/planner-api';
import { RestorationPanel } from '../components/restoration-panel';
import { usePatient } from '../../patients';

/** /patients/:patientId/restorations: every restoration of the patient, amended versions included. */
export function RestorationsRoute() {
  const { patientId = '' } = useParams();
  const patient = usePatient(patientId);
  const patientName = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';
  const [system] = useToothSystem();
  const list = useRestorations(patientId);
  if (list.isPending) return <LoadingState label="Loading restorations" />;
  if (list.isError)
    return (
      <ErrorState title="Could not load the restorations" error={list.error} onRetry={() => void list.refetch()} />
    );
  return (
    <div className="restorations-page">
      <title>Restorations · Torquetrail</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: patientName, to: `/patients/${patientId}` },
          { text: 'Restorations' },
        ]}
      />
      <div className="section-heading">
        <h1>Restorations</h1>
        <Can I="create" a="Restoration">
          <Link
            className={`${Classes.BUTTON} ${Classes.INTENT_PRIMARY}`}
            to={`/patients/${patientId}/restorations/new`}
            data-testid="new-plan"
          >
            New plan
          </Link>
        </Can>
      </div>
      {list.data.items.length === 0 ? (
        <NonIdealState icon="clipboard" title="No restorations yet" />
      ) : (
        list.data.items.map((r) => (
          <RestorationPanel key={r.id} restoration={r} system={system} patientId={patientId} />
        ))
      )}
    </div>
  );
}
