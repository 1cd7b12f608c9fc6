import '../components/patients.css';
import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { PatientSettingsBody, type PatientSettingsReply } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { usePatientSettings, useUpdatePatientSettings } from '../api/patient-records';
import { ChartNumber } from '../../../lib/components/chart-number';
import { runMutation } from '../../../lib/run-mutation';

/** /practice/patient-settings: the chart-number prefix of new patients (practice admin). */
export function PatientSettingsRoute() {
  const settings = usePatientSettings();
  return (
    <div className="patient-record-page">
      <title>Patient settings · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Practice' }, { text: 'Patients' }]} />
      <h1 className="page-title">Patients</h1>
      {settings.isPending ? (
        <LoadingState label="Loading the settings" />
      ) : settings.isError ? (
        <ErrorState
          title="Could not load the settings"
          error={settings.error}
          onRetry={() => void settings.refetch()}
        />
      ) : (
        <SettingsForm settings={settings.data} />
      )}
    </div>
  );
}

function SettingsForm({ settings }: { settings: PatientSettingsReply }) {
  const update = useUpdatePatientSettings();
  const form = useContractForm<PatientSettingsBody, PatientSettingsBody>(PatientSettingsBody, {
    chartPrefix: settings.chartPrefix,
  });
  const submit = (body: PatientSettingsBody) =>
    runMutation(update, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form onSubmit={(event) => void form.handleSubmit(submit, () => update.reset())(event)} noValidate>
        <FormField
          name="chartPrefix"
          label="Chart-number prefix"
          labelFor="chart-prefix"
          help="New patients are numbered with it. Existing chart numbers do not change."
        >
          {(a11y) => <InputGroup id="chart-prefix" {...a11y} {...withInputRef(form.register('chartPrefix'))} />}
        </FormField>
        <p data-testid="next-chart-number">
          The next new patient gets{' '}
          <strong>
            <ChartNumber value={update.data?.nextChartNumber ?? settings.nextChartNumber} />
          </strong>
          .
        </p>
        <Can I="update" a="Practice">
          <Button type="submit" intent="primary" loading={update.isPending}>
            Save
          </Button>
        </Can>
        {update.isSuccess && <Callout intent="success">Saved.</Callout>}
        {formError && <Callout intent="danger">{formError}</Callout>}
      </form>
    </FormProvider>
  );
}
