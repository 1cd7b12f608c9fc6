import { Button, InputGroup } from '@blueprintjs/core';
import type { ReactNode } from 'react';
import { type FieldValues, FormProvider, type Path, type UseFormReturn } from 'react-hook-form';
import { withInputRef } from './blueprint-inputs';
import { FormField } from './form-field';
import { formErrorMessage } from './server-errors';

/**
 * The one shell of every "Amend this entry" form (Timeline entries, insert changes): the corrected
 * fields the caller gives, then the amendment's reason (required: the contract's message shows
 * beside it), the form's summary and Save/Cancel. Enter saves; the caller closes it on Escape.
 * The old entry stays in the record, marked amended; the form only writes a new version.
 */
export function AmendmentForm<T extends FieldValues & { amendmentReason: string }, B>({
  form,
  onSubmit,
  idPrefix,
  pending,
  onCancel,
  className = 'amend-form',
  children,
}: {
  form: UseFormReturn<T, unknown, B>;
  onSubmit: (body: B) => void;
  /** Makes the inputs' ids unique on the page (one form per entry). */
  idPrefix: string;
  pending: boolean;
  onCancel: () => void;
  className?: string;
  children: ReactNode;
}) {
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const reasonId = `${idPrefix}-amendment-reason`;
  return (
    <FormProvider {...form}>
      <form
        className={className}
        onSubmit={(e) => void form.handleSubmit(onSubmit)(e)}
        aria-label="Amend this entry"
        noValidate
      >
        {children}
        <FormField
          name="amendmentReason"
          label="Reason for the amendment (required)"
          labelFor={reasonId}
          help="Say why the entry is corrected; the original stays in the record, marked amended."
        >
          {(a11y) => (
            <InputGroup id={reasonId} {...a11y} {...withInputRef(form.register('amendmentReason' as Path<T>))} />
          )}
        </FormField>
        {formError && (
          <p className="planner-error" role="alert">
            {formError}
          </p>
        )}
        <Button type="submit" small intent="primary" text="Save amendment" loading={pending} />
        <Button small variant="minimal" text="Cancel" onClick={onCancel} />
      </form>
    </FormProvider>
  );
}
