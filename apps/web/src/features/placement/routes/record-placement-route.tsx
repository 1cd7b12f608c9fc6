import '../components/placement.css';
import { formatTooth } from '@torquetrail/domain';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useToothSystem } from '../../../lib/tooth-system';
import { usePatient } from '../../patients';
import { usePlacementOptions } from '../api/get-placement-options';
import { PlacementForm } from '../components/placement-form';

/** /patients/:patientId/sites/:siteId/placement: record what was placed at a planned site. */
export function RecordPlacementRoute() {
  const { patientId = '', siteId = '' } = useParams();
  const options = usePlacementOptions(siteId);
  const patient = usePatient(patientId);
  const [system] = useToothSystem();
  const navigate = useNavigate();
  const siteFile = `/patients/${patientId}/sites/${siteId}`;
  const name = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';

  if (options.isPending) return <LoadingState label="Loading the implant systems" />;
  if (options.isError) {
    return (
      <>
        <title>Record placement · Torquetrail</title>
        <BreadcrumbTrail
          items={[
            { text: 'Patients', to: '/patients' },
            { text: name, to: `/patients/${patientId}` },
            { text: 'Record placement' },
          ]}
        />
        <ErrorState
          title={
            isApiError(options.error, 404)
              ? 'Site not found'
              : isApiError(options.error, 403)
                ? 'Your role may not record a placement here'
                : 'Could not load the implant systems'
          }
          error={options.error}
          onRetry={() => void options.refetch()}
        >
          <Link to={siteFile}>Back to the Site file</Link>
        </ErrorState>
      </>
    );
  }

  const siteLabel = `Site ${formatTooth(options.data.fdi, system)}`;
  return (
    <div className="placement-page">
      <title>{`Record placement · ${siteLabel} · ${name} · Torquetrail`}</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: name, to: `/patients/${patientId}` },
          { text: siteLabel, to: siteFile },
          { text: 'Record placement' },
        ]}
      />
      <h1 className="page-title">Record placement · {siteLabel}</h1>
      <PlacementForm
        patientId={patientId}
        siteId={siteId}
        options={options.data}
        onDone={() => void navigate(siteFile)}
      />
    </div>
  );
}
