import '../components/patients.css';
import { Callout } from '@blueprintjs/core';
import { subject } from '@torquetrail/authz';
import { type PatientDetail, UpdatePatientBody } from '@torquetrail/contracts';
import { Link, useParams } from 'react-router-dom';
import { Can, useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, draftSchema, useContractForm } from '../../../lib/forms';
import { usePatient } from '../api/get-patient';
import { useDuplicates, useUpdatePatient } from '../api/patient-records';
import { ArchiveControl } from '../components/archive-control';
import { DuplicateWarning } from '../components/duplicate-warning';
import { HistoryPanel } from '../components/history-panel';
import { draftOf, draftToRecord, type PatientDraft, PatientForm } from '../components/patient-form';
import { ChartNumber } from '../../../lib/components/chart-number';
import { runMutation } from '../../../lib/run-mutation';

/** /patients/:patientId/edit: the record, its archive switch and its History. */
export function EditPatientRoute() {
  const { patientId = '' } = useParams();
  const patient = usePatient(patientId);
  if (patient.isPending) return <LoadingState label="Loading the patient" />;
  if (patient.isError)
    return (
      <ErrorState
        title={isApiError(patient.error, 404) ? 'Patient not found' : 'Could not load the patient'}
        error={patient.error}
        onRetry={() => void patient.refetch()}
      >
        <Link to="/patients">Back to Patients</Link>
      </ErrorState>
    );
  const p = patient.data;
  const name = `${p.givenName} ${p.familyName}`;
  const row = subject('Patient', { id: p.id, practiceId: p.practiceId });
  return (
    <div className="patient-record-page">
      <title>{`Edit ${name} · Torquetrail`}</title>
      <BreadcrumbTrail
        items={[{ text: 'Patients', to: '/patients' }, { text: name, to: `/patients/${p.id}` }, { text: 'Edit' }]}
      />
      <h1 className="page-title">
        {name}{' '}
        <span className="muted">
          <ChartNumber value={p.chartNumber} />
        </span>
      </h1>
      {/* Keyed by the record's identity so a save elsewhere does not reset what is being typed. */}
      <EditForm key={p.id} patient={p} />
      <Can I="archive" this={row}>
        <section className="record-section" aria-labelledby="archive-heading">
          <h2 id="archive-heading">{p.archive ? 'Archived' : 'Archive'}</h2>
          <ArchiveControl patient={p} />
        </section>
      </Can>
      <Can I="read" this={subject('PatientVersion', { practiceId: p.practiceId, patientId: p.id })}>
        <section className="record-section" aria-labelledby="history-heading">
          <h2 id="history-heading">History</h2>
          <HistoryPanel patientId={p.id} />
        </section>
      </Can>
    </div>
  );
}

function EditForm({ patient }: { patient: PatientDetail }) {
  const ability = useAppAbility();
  const row = subject('Patient', { id: patient.id, practiceId: patient.practiceId });
  const editable = (field: keyof PatientDraft) =>
    !patient.archive &&
    ability.can('update', row, field) &&
    (field !== 'chartNumber' || patient.chartNumberChangeable === true);
  const update = useUpdatePatient(patient.id);
  // Only the fields this user may change are sent (the hygienist's: contact details).
  const schema = draftSchema(UpdatePatientBody, (d: PatientDraft) => {
    const all: Record<string, unknown> = { ...draftToRecord(d), chartNumber: d.chartNumber.trim() };
    return Object.fromEntries(
      Object.entries(all).filter(([field]) => editable(field as keyof PatientDraft)),
    ) as UpdatePatientBody;
  });
  const form = useContractForm<PatientDraft, UpdatePatientBody>(schema, draftOf(patient));
  const [familyName, birthDate] = form.watch(['familyName', 'birthDate']);
  const changedIdentity = familyName !== patient.familyName || birthDate !== patient.birthDate;
  const duplicates = useDuplicates(changedIdentity ? familyName : '', birthDate.trim(), patient.id);
  const submit = (body: UpdatePatientBody) =>
    runMutation(update, body, {
      onSuccess: (saved) => form.reset(draftOf(saved)),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  if (!ability.can('update', row)) return null;
  return (
    <>
      {patient.archive && (
        <Callout intent="warning" className="record-section">
          This patient is archived. Bring them back below to edit the record.
        </Callout>
      )}
      {!ability.can('update', row, 'givenName') && (
        <Callout intent="primary">Your role may change the contact details and the consent to reminders.</Callout>
      )}
      <PatientForm
        form={form}
        onSubmit={submit}
        saving={update.isPending}
        submitLabel="Save changes"
        editable={editable}
        chartNumber={patient.chartNumberChangeable ? 'editable' : 'fixed'}
        beforeSubmit={
          <>
            {duplicates.data && duplicates.data.matches.length > 0 && (
              <DuplicateWarning matches={duplicates.data.matches} />
            )}
            {update.isSuccess && !form.formState.isDirty && <Callout intent="success">Saved.</Callout>}
          </>
        }
      />
    </>
  );
}
