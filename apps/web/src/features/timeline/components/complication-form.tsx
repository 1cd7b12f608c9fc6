import { Button, Callout, HTMLSelect, TextArea } from '@blueprintjs/core';
import { ComplicationBody, type ComplicationKind, type StackPart } from '@torquetrail/contracts';
import { useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { COMPLICATION_KIND_LABEL } from '../../../lib/clinical-labels';
import { localToday } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  formErrorMessage,
  FormField,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useRecordComplication } from '../api/record-complication';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';
import './timeline.css';

interface ComplicationDraft {
  kind: ComplicationKind;
  /** '' = the site as a whole. */
  componentInstanceId: string;
  occurredOn: string;
  notes: string;
}

/** "Record complication": linked to the site and, optionally, one of its parts. */
export function ComplicationPanel({ siteId, parts }: { siteId: string; parts: StackPart[] }) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const schema = useMemo(
    () =>
      draftSchema(ComplicationBody, (d: ComplicationDraft) => ({
        siteId,
        kind: d.kind,
        componentInstanceId: d.componentInstanceId || null,
        occurredOn: d.occurredOn,
        notes: d.notes || null,
      })),
    [siteId],
  );
  const form = useContractForm(schema, {
    kind: 'screw-loosening',
    componentInstanceId: '',
    occurredOn: localToday(),
    notes: '',
  });
  const record = useRecordComplication(siteId);
  const submit = (body: ComplicationBody) =>
    runMutation(record, body, {
      onSuccess: () => setOpen(false),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <Can I="create" a="Complication">
      <Button
        icon="warning-sign"
        text="Record complication"
        onClick={() => setOpen((v) => !v)}
        aria-expanded={open}
        data-testid="record-complication"
      />
      {open && (
        <FormProvider {...form}>
          <form
            onSubmit={(event) => void form.handleSubmit(submit)(event)}
            className="torque-form complication-form"
            aria-label="Record complication"
            noValidate
          >
            <FormField name="kind" label="Complication" labelFor="complication-kind">
              <HTMLSelect id="complication-kind" {...form.register('kind')}>
                {Object.entries(COMPLICATION_KIND_LABEL).map(([v, t]) => (
                  <option key={v} value={v}>
                    {t}
                  </option>
                ))}
              </HTMLSelect>
            </FormField>
            <FormField name="componentInstanceId" label="Part (optional)" labelFor="complication-part">
              <HTMLSelect id="complication-part" {...form.register('componentInstanceId')}>
                <option value="">The site as a whole</option>
                {parts.map((p) => (
                  <option key={p.instanceId} value={p.instanceId}>
                    {p.name} ({p.referenceCode})
                  </option>
                ))}
              </HTMLSelect>
            </FormField>
            <FormField name="occurredOn" label="Date" labelFor="complication-date">
              <DateField id="complication-date" name="occurredOn" />
            </FormField>
            <FormField name="notes" label="Notes" labelFor="complication-notes">
              <TextArea id="complication-notes" fill {...withInputRef(form.register('notes'))} />
            </FormField>
            {formError && (
              <Callout intent="danger" role="alert" compact>
                {formError}
              </Callout>
            )}
            <div className="torque-form__actions">
              <Button type="submit" intent="primary" text="Save complication" loading={record.isPending} />
              <Button variant="minimal" text="Cancel" onClick={() => setOpen(false)} />
            </div>
          </form>
        </FormProvider>
      )}
    </Can>
  );
}
