import { Button, Callout, Card, TextArea } from '@blueprintjs/core';
import { EnteredInErrorBody, type RadiographDetail } from '@torquetrail/contracts';
import { useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { formatDateTime } from '../../../lib/dates';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { useMarkEnteredInError } from '../api/radiographs-api';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';

/**
 * A radiograph filed to the wrong patient or site is never deleted: it is marked entered in error
 * with a reason, hidden from lists by default, and its file stays in storage.
 */
export function EnteredInErrorCard({ radiograph }: { radiograph: RadiographDetail }) {
  const mark = useMarkEnteredInError(radiograph.id);
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const form = useContractForm<EnteredInErrorBody, EnteredInErrorBody>(EnteredInErrorBody, { reason: '' });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  if (radiograph.enteredInError) {
    return (
      <Callout intent="warning" title="Entered in error" data-testid="entered-in-error">
        Marked on {formatDateTime(radiograph.enteredInError.at)}: {radiograph.enteredInError.reason}. It is kept in the
        record and hidden from lists; its measurements no longer feed the bone-level chart or the exam form.
      </Callout>
    );
  }
  const submit = form.handleSubmit((body) =>
    runMutation(mark, body, { onError: (error) => applyServerErrors(form.setError, error) }),
  );
  return (
    <Can I="amend" a="Radiograph">
      <Card className="viewer-entered-in-error">
        {open ? (
          <FormProvider {...form}>
            <form onSubmit={(e) => void submit(e)} noValidate>
              <FormField
                name="reason"
                label="Why is this radiograph entered in error?"
                labelFor="entered-in-error-reason"
                help="For example: filed to the wrong patient or the wrong site"
              >
                {(a11y) => (
                  <TextArea id="entered-in-error-reason" fill {...withInputRef(form.register('reason'))} {...a11y} />
                )}
              </FormField>
              {formError && <p role="alert">{formError}</p>}
              <Button type="submit" intent="danger" text="Mark entered in error" loading={mark.isPending} />{' '}
              <Button text="Cancel" onClick={() => setOpen(false)} />
            </form>
          </FormProvider>
        ) : (
          <Button icon="disable" text="Mark entered in error…" onClick={() => setOpen(true)} />
        )}
      </Card>
    </Can>
  );
}
