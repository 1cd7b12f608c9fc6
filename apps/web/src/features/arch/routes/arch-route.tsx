import '../components/arch.css';
import { Callout, Classes, NonIdealState } from '@blueprintjs/core';
import { isPrimaryTooth, TOOTH_POSITIONS_PERMANENT, TOOTH_POSITIONS_PRIMARY } from '@torquetrail/domain';
import { subject } from '@torquetrail/authz';
import { lazy } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { AfterFirstPaint } from '../../../lib/components/after-first-paint';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDate } from '../../../lib/dates';
import { MAINTENANCE_NOTE } from '../../../lib/labels';
import { useToothSystem } from '../../../lib/tooth-system';
import { usePatient } from '../../patients';
import { ArchDrawing } from '../components/arch-drawing';
import { ArchLegend } from '../components/arch-legend';
import { NumberingSwitch } from '../components/numbering-switch';
import { PatientHeader } from '../components/patient-header';
import { SitesTable } from '../components/sites-table';

// What sits below the Arch loads after it has shown: the site form (react-hook-form) and the
// panels (shares, referral summary, records out, access trail) are chunks of their own, so the
// first view needs only the drawing's code (issue 13, goal 3).
const AddSiteControl = lazy(() =>
  import('../components/add-site-control').then((m) => ({ default: m.AddSiteControl })),
);
const PatientPanels = lazy(() => import('../components/patient-panels'));

/** /patients/:patientId: the patient's mouth as two arches, and the list of implant sites. */
export function ArchRoute() {
  const { patientId = '' } = useParams();
  const patient = usePatient(patientId);
  const [system] = useToothSystem();
  const navigate = useNavigate();

  if (patient.isPending) return <LoadingState label="Loading the patient" />;
  if (patient.isError) {
    return (
      <>
        <title>Patient · Torquetrail</title>
        <BreadcrumbTrail items={[{ text: 'Patients', to: '/patients' }, { text: 'Patient' }]} />
        <ErrorState
          title={isApiError(patient.error, 404) ? 'Patient not found' : 'Could not load the patient'}
          error={patient.error}
          onRetry={() => void patient.refetch()}
        >
          <Link to="/patients">Back to Patients</Link>
        </ErrorState>
      </>
    );
  }

  const data = patient.data;
  const name = `${data.givenName} ${data.familyName}`;
  const openSite = (siteId: string) => void navigate(`/patients/${data.id}/sites/${siteId}`);
  const hasPrimary = [...data.sites.map((s) => s.fdi), ...(data.missingTeeth ?? [])].some(isPrimaryTooth);

  return (
    <div className="arch-page">
      <title>{`${name} · Arch · Torquetrail`}</title>
      <BreadcrumbTrail items={[{ text: 'Patients', to: '/patients' }, { text: name }]} />
      <PatientHeader patient={data} />
      {data.archive && (
        <Callout intent="warning" icon="archive" data-testid="archived-callout">
          Archived on {formatDate(data.archive.at.slice(0, 10))} by {data.archive.byName}: {data.archive.reason}. No
          reminders are sent.
        </Callout>
      )}
      <nav className="arch-actions" aria-label="Patient actions">
        <Can I="update" this={subject('Patient', { id: data.id, practiceId: data.practiceId })}>
          <Link className={Classes.BUTTON} to={`/patients/${data.id}/edit`} data-testid="edit-patient">
            Edit record and history
          </Link>
        </Can>
        <Can I="read" a="Restoration">
          <Link className={Classes.BUTTON} to={`/patients/${data.id}/restorations`} data-testid="open-restorations">
            Restorations and planner
          </Link>
        </Can>
        <Can I="read" a="Radiograph">
          <Link className={Classes.BUTTON} to={`/patients/${data.id}/radiographs`} data-testid="open-radiographs">
            Radiographs
          </Link>
        </Can>
        <Can I="create" a="RecallExam">
          <Link
            className={`${Classes.BUTTON} ${Classes.INTENT_PRIMARY}`}
            to={`/recalls/patients/${data.id}/exam`}
            data-testid="open-exam-form"
          >
            Record a recall exam
          </Link>
        </Can>
      </nav>

      <section className="arch-section" aria-labelledby="arch-heading">
        <div className="section-heading">
          <h2 id="arch-heading">Arch</h2>
          <NumberingSwitch />
        </div>
        <div className="arch-layout">
          <div className="arch-figure">
            <ArchDrawing
              positions={TOOTH_POSITIONS_PERMANENT}
              sites={data.sites}
              missingTeeth={data.missingTeeth ?? []}
              system={system}
              onOpenSite={openSite}
              label="Dental arches"
              testId="arch-svg"
            />
            {hasPrimary && (
              <>
                <h3>Primary teeth</h3>
                <ArchDrawing
                  positions={TOOTH_POSITIONS_PRIMARY}
                  sites={data.sites}
                  missingTeeth={data.missingTeeth ?? []}
                  system={system}
                  onOpenSite={openSite}
                  label="Primary dental arches"
                  testId="arch-svg-primary"
                />
              </>
            )}
            <p className="arch-hint muted">
              Arrow keys move between positions; Enter opens an implant site's Site file.
            </p>
          </div>
          <ArchLegend />
        </div>
      </section>

      <section className="sites-section" aria-labelledby="sites-heading">
        <h2 id="sites-heading">Implant sites</h2>
        <Can I="create" this={subject('ImplantSite', { practiceId: data.practiceId, patientId: data.id })}>
          <AfterFirstPaint>
            <AddSiteControl patientId={data.id} sites={data.sites} system={system} />
          </AfterFirstPaint>
        </Can>
        {data.sites.length === 0 ? (
          <NonIdealState
            icon="inbox"
            title="No implant sites recorded"
            description="Sites appear here once planned or placed."
          />
        ) : (
          <>
            <SitesTable patientId={data.id} sites={data.sites} system={system} />
            <p className="maintenance-note">{MAINTENANCE_NOTE}</p>
          </>
        )}
      </section>
      <AfterFirstPaint>
        <PatientPanels patient={data} />
      </AfterFirstPaint>
    </div>
  );
}
