import { Button, Callout, TextArea } from '@blueprintjs/core';
import { ArchivePatientBody, type PatientDetail } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { formatDateTime } from '../../../lib/dates';
import { useArchivePatient } from '../api/patient-records';
import { runMutation } from '../../../lib/run-mutation';

/** Archive (or bring back) with a reason. Nothing is deleted; an archived patient gets no reminders. */
export function ArchiveControl({ patient }: { patient: PatientDetail }) {
  const archived = Boolean(patient.archive);
  const mutation = useArchivePatient(patient.id);
  const form = useContractForm<ArchivePatientBody, ArchivePatientBody>(ArchivePatientBody, { reason: '' });
  const submit = (body: ArchivePatientBody) =>
    runMutation(
      mutation,
      { archived: !archived, body },
      { onSuccess: () => form.reset({ reason: '' }), onError: (error) => applyServerErrors(form.setError, error) },
    );
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form className="archive-form" onSubmit={(event) => void form.handleSubmit(submit)(event)} noValidate>
        {patient.archive ? (
          <p>
            Archived on {formatDateTime(patient.archive.at)} by {patient.archive.byName}: {patient.archive.reason}
          </p>
        ) : (
          <p className="muted">
            An archived patient leaves the Patients list and the Recall desk (a filter still shows them), and gets no
            reminders. Nothing is deleted.
          </p>
        )}
        <FormField
          name="reason"
          label={archived ? 'Why bring the patient back?' : 'Why archive?'}
          labelFor="archive-reason"
        >
          {(a11y) => (
            <TextArea id="archive-reason" {...a11y} fill rows={2} {...withInputRef(form.register('reason'))} />
          )}
        </FormField>
        {formError && <Callout intent="danger">{formError}</Callout>}
        <Button
          type="submit"
          intent={archived ? 'primary' : 'warning'}
          loading={mutation.isPending}
          data-testid="archive-patient"
        >
          {archived ? 'Bring back' : 'Archive patient'}
        </Button>
      </form>
    </FormProvider>
  );
}
