import '../components/site-file.css';
import { formatTooth } from '@torquetrail/domain';
import { Classes } from '@blueprintjs/core';
import { Link, Navigate, useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useToothSystem } from '../../../lib/tooth-system';
import { useSiteFile } from '../api/get-site-file';
import { SiteFileHeader } from '../components/site-file-header';
import { Stack } from '../components/stack';
import { Timeline } from '../../timeline';
import { InsertChangesCard } from '../../insert-changes';
import { ProbingDepthChart } from '../../recalls';
import { BoneLevelChart, SiteRadiographs } from '../../radiographs';

/** /patients/:patientId/sites/:siteId: one implant, its header and its Stack. */
export function SiteFileRoute() {
  const { patientId = '', siteId = '' } = useParams();
  const site = useSiteFile(siteId);
  const [system] = useToothSystem();

  if (site.isPending) return <LoadingState label="Loading the Site file" />;
  if (site.isError) {
    return (
      <>
        <title>Site file · Torquetrail</title>
        <BreadcrumbTrail
          items={[
            { text: 'Patients', to: '/patients' },
            { text: 'Patient', to: `/patients/${patientId}` },
            { text: 'Site file' },
          ]}
        />
        <ErrorState
          title={isApiError(site.error, 404) ? 'Site file not found' : 'Could not load the Site file'}
          error={site.error}
          onRetry={() => void site.refetch()}
        >
          <Link to={`/patients/${patientId}`}>Back to the Arch</Link>
        </ErrorState>
      </>
    );
  }

  const data = site.data;
  // A site reached under another patient's address is shown under its own patient.
  if (data.patientId !== patientId) return <Navigate to={`/patients/${data.patientId}/sites/${data.id}`} replace />;

  const siteLabel = `Site ${formatTooth(data.fdi, system)}`;
  return (
    <div className="site-file-page">
      <title>{`${siteLabel} · ${data.patientName} · Torquetrail`}</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: data.patientName, to: `/patients/${data.patientId}` },
          { text: siteLabel },
        ]}
      />
      <SiteFileHeader site={data} system={system} />
      {data.status === 'planned' && (
        <Can I="create" a="Placement">
          <p className="site-file__links">
            <Link
              className={`${Classes.BUTTON} ${Classes.INTENT_PRIMARY}`}
              to={`/patients/${data.patientId}/sites/${data.id}/placement`}
              data-testid="record-placement"
            >
              Record placement
            </Link>
          </p>
        </Can>
      )}
      <Stack site={data} system={system} />
      <InsertChangesCard site={data} />
      <p className="site-file__links">
        <Link to={`/patients/${data.patientId}/restorations`}>Restorations and planner of {data.patientName}</Link>
      </p>
      <Timeline siteId={data.id} patientId={data.patientId} parts={data.parts} />
      <ProbingDepthChart siteId={data.id} />
      <BoneLevelChart siteId={data.id} patientId={data.patientId} />
      <SiteRadiographs patientId={data.patientId} siteId={data.id} />
    </div>
  );
}
