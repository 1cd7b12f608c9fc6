import { Button, Callout } from '@blueprintjs/core';
import { InsertReviewSettings } from '@torquetrail/contracts';
import { DEFAULT_INSERT_REVIEW_MONTHS, INSERT_REVIEW_MONTHS_RANGE } from '@torquetrail/domain';
import { FormProvider } from 'react-hook-form';
import { useAppAbility } from '../../../lib/ability';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import { useInsertReviewSettings, useSaveInsertReviewSettings } from '../api/insert-review-settings';

const HELP =
  `An overdenture is listed on the Recall desk when its last retentive-insert change (or its delivery) ` +
  `is older than this. Default ${DEFAULT_INSERT_REVIEW_MONTHS} months, a common practice: no published ` +
  `source fixes the interval.`;

/** The practice's overdenture insert review interval: the admin sets it, the others read it. */
export function InsertReviewSection() {
  const settings = useInsertReviewSettings();
  const canEdit = useAppAbility().can('update', 'Practice');
  return (
    <section aria-labelledby="insert-review-heading" id="insert-review">
      <h2 id="insert-review-heading">Overdenture insert review</h2>
      {settings.isPending ? (
        <p>Loading the interval…</p>
      ) : settings.isError ? (
        <Callout intent="danger">Could not load the insert review interval.</Callout>
      ) : canEdit ? (
        <InsertReviewForm months={settings.data.insertReviewIntervalMonths} />
      ) : (
        <p data-testid="insert-review-summary">
          Every {settings.data.insertReviewIntervalMonths} months. <span className="recall-policy__help">{HELP}</span>
        </p>
      )}
    </section>
  );
}

function InsertReviewForm({ months }: { months: number }) {
  const form = useContractForm(InsertReviewSettings, { insertReviewIntervalMonths: months });
  const save = useSaveInsertReviewSettings();
  const submit = (body: InsertReviewSettings) =>
    runMutation(save, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        onSubmit={(event) => void form.handleSubmit(submit, () => save.reset())(event)}
        aria-label="Insert review interval"
        noValidate
      >
        <FormField
          name="insertReviewIntervalMonths"
          label="Insert review interval (months)"
          labelFor="insert-review-months"
          help={HELP}
        >
          <NumberInput
            name="insertReviewIntervalMonths"
            id="insert-review-months"
            min={INSERT_REVIEW_MONTHS_RANGE.min}
            max={INSERT_REVIEW_MONTHS_RANGE.max}
            buttonPosition="none"
          />
        </FormField>
        <Button type="submit" intent="primary" text="Save interval" loading={save.isPending} />
        {save.isSuccess && <Callout intent="success">Saved. The Recall desk follows the new interval.</Callout>}
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
      </form>
    </FormProvider>
  );
}
