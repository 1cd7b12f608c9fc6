import { Button, Callout } from '@blueprintjs/core';
import { CantileverSettings } from '@torquetrail/contracts';
import { CANTILEVER_RATIO_RANGE } from '@torquetrail/domain';
import { FormProvider } from 'react-hook-form';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import { useCantileverSettings, useSaveCantileverSettings } from '../api/cantilever-settings';

/**
 * The practice's cantilever limit (admin): the longest distal cantilever of full-arch work as a
 * multiple of the A-P spread. Without one, 1.5 [common practice], the rule of thumb attributed to
 * English CE 1990 [memory] for the mandible.
 */
export function CantileverSettingsForm() {
  const settings = useCantileverSettings();
  if (!settings.data) return null;
  return <CantileverSettingsFields ratio={settings.data.cantileverRatioLimit} />;
}

function CantileverSettingsFields({ ratio }: { ratio: number }) {
  const form = useContractForm(CantileverSettings, { cantileverRatioLimit: ratio });
  const save = useSaveCantileverSettings();
  const submit = (body: CantileverSettings) =>
    runMutation(save, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <section aria-labelledby="cantilever-heading">
      <h2 id="cantilever-heading">Cantilever limit</h2>
      <FormProvider {...form}>
        <form
          className="wrench-settings"
          onSubmit={(event) => void form.handleSubmit(submit)(event)}
          aria-label="Cantilever limit"
          noValidate
        >
          <FormField
            name="cantileverRatioLimit"
            label="Cantilever limit (× A-P spread)"
            labelFor="cantilever-ratio"
            help="The planner cautions when a distal cantilever of full-arch work is longer than this multiple of the A-P spread; 1.5 is a common rule of thumb for the mandible. A caution, never a diagnosis."
          >
            <NumberInput
              name="cantileverRatioLimit"
              id="cantilever-ratio"
              min={CANTILEVER_RATIO_RANGE.min}
              max={CANTILEVER_RATIO_RANGE.max}
              stepSize={0.1}
              minorStepSize={0.1}
              buttonPosition="none"
            />
          </FormField>
          {formError && (
            <Callout intent="danger" role="alert" compact>
              {formError}
            </Callout>
          )}
          <Button type="submit" small text="Save limit" loading={save.isPending} />
        </form>
      </FormProvider>
    </section>
  );
}
