import '../components/radiographs.css';
import { Card, NonIdealState, Switch, Tag } from '@blueprintjs/core';
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { RADIOGRAPH_FILE_TYPE_LABEL, RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { usePatient } from '../../patients';
import { useRadiographs } from '../api/radiographs-api';
import { PreviewNotice } from '../components/preview-notice';
import { UploadPanel } from '../components/upload-panel';

/** /patients/:patientId/radiographs: upload, and every radiograph of the patient with its thumbnail. */
export function RadiographsRoute() {
  const { patientId = '' } = useParams();
  const patient = usePatient(patientId);
  const patientName = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';
  const [showEnteredInError, setShowEnteredInError] = useState(false);
  const list = useRadiographs(patientId, showEnteredInError);
  return (
    <div className="radiographs-page">
      <title>Radiographs · Torquetrail</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: patientName, to: `/patients/${patientId}` },
          { text: 'Radiographs' },
        ]}
      />
      <h1>Radiographs</h1>
      <Can I="create" a="Radiograph">
        <UploadPanel patientId={patientId} sites={patient.data?.sites ?? []} />
      </Can>
      <Switch
        label="Show entered in error"
        checked={showEnteredInError}
        onChange={() => setShowEnteredInError((v) => !v)}
        data-testid="show-entered-in-error"
      />
      {list.isPending ? (
        <LoadingState label="Loading radiographs" />
      ) : list.isError ? (
        <ErrorState title="Could not load the radiographs" error={list.error} onRetry={() => void list.refetch()} />
      ) : list.data.items.length === 0 ? (
        <NonIdealState icon="media" title="No radiographs yet" />
      ) : (
        <div className="radiograph-grid">
          {list.data.items.map((r) => (
            <Card key={r.id} className="radiograph-card" data-testid="radiograph-card">
              {r.previewStatus !== 'ready' ? (
                <PreviewNotice radiograph={r} compact />
              ) : (
                <img src={`/api/radiographs/${r.id}/thumbnail`} alt={`${RADIOGRAPH_KIND_LABEL[r.kind]} radiograph`} />
              )}
              <div>
                <Tag minimal>{RADIOGRAPH_KIND_LABEL[r.kind]}</Tag> {r.takenOn ?? 'date not known'}
              </div>
              {r.enteredInError && (
                <Tag intent="warning" title={r.enteredInError.reason} data-testid="entered-in-error-tag">
                  Entered in error
                </Tag>
              )}
              <small>{RADIOGRAPH_FILE_TYPE_LABEL[r.fileType]}</small>{' '}
              <Link to={`/patients/${patientId}/radiographs/${r.id}`} data-testid="open-viewer">
                Open viewer
              </Link>
            </Card>
          ))}
        </div>
      )}
    </div>
  );
}
