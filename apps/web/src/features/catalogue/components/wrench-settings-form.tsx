import { Button, Callout } from '@blueprintjs/core';
import { WrenchSettings } from '@torquetrail/contracts';
import { CALIBRATION_INTERVAL_RANGE } from '@torquetrail/domain';
import { FormProvider } from 'react-hook-form';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { useSaveWrenchSettings } from '../../torque';
import { runMutation } from '../../../lib/run-mutation';

/**
 * The practice's wrench calibration interval (admin). Without one, 12 months [common practice]:
 * the yearly interval usually quoted for hand torque tools (often attributed to ISO 6789-1:2017).
 */
export function WrenchSettingsForm({ months }: { months: number }) {
  const form = useContractForm(WrenchSettings, { calibrationIntervalMonths: months });
  const save = useSaveWrenchSettings();
  const submit = (body: WrenchSettings) =>
    runMutation(save, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="wrench-settings"
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
        aria-label="Calibration interval"
        noValidate
      >
        <FormField
          name="calibrationIntervalMonths"
          label="Calibration interval (months)"
          labelFor="wrench-interval"
          help="A wrench is overdue this many months after its latest calibration; 12 months is common practice when the practice sets none."
        >
          <NumberInput
            name="calibrationIntervalMonths"
            id="wrench-interval"
            min={CALIBRATION_INTERVAL_RANGE.min}
            max={CALIBRATION_INTERVAL_RANGE.max}
            buttonPosition="none"
            allowNumericCharactersOnly
          />
        </FormField>
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
        <Button type="submit" small text="Save interval" loading={save.isPending} />
      </form>
    </FormProvider>
  );
}
