import { Button, Callout } from '@blueprintjs/core';
import { InsertChangeBody, type SiteFile } from '@torquetrail/contracts';
import { useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { localToday } from '../../../lib/dates';
import { applyServerErrors, draftSchema, formErrorMessage, useContractForm } from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { useLogInsertChange } from '../api/log-insert-change';
import { InsertChangeFields, type InsertDraft, useInsertParts } from './insert-change-fields';

export function LogInsertChange({ site }: { site: SiteFile }) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const parts = useInsertParts(site);
  const schema = useMemo(
    () =>
      draftSchema(InsertChangeBody, (d: InsertDraft) => ({
        siteId: site.id,
        changedOn: d.changedOn,
        oldComponentId: d.oldComponentId || null,
        newComponentId: d.newComponentId,
        reason: d.reason,
        notes: d.notes || null,
      })),
    [site.id],
  );
  const form = useContractForm(schema, {
    changedOn: localToday(),
    oldComponentId: '',
    newComponentId: '',
    reason: 'wear',
    notes: '',
  });
  const log = useLogInsertChange(site.id);
  const submit = (body: InsertChangeBody) =>
    runMutation(log, body, {
      onSuccess: () => {
        form.reset();
        setOpen(false);
      },
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <Can I="create" a="InsertChange">
      <Button
        icon="exchange"
        text="Log insert change"
        onClick={() => setOpen((v) => !v)}
        aria-expanded={open}
        data-testid="log-insert-change"
      />
      {open && (
        <FormProvider {...form}>
          <form
            onSubmit={(event) => void form.handleSubmit(submit)(event)}
            className="insert-changes__form"
            aria-label="Log insert change"
            noValidate
          >
            <InsertChangeFields idPrefix="log-insert" parts={parts} />
            {formError && (
              <Callout intent="danger" role="alert" compact>
                {formError}
              </Callout>
            )}
            <div className="insert-changes__actions">
              <Button type="submit" intent="primary" text="Save insert change" loading={log.isPending} />
              <Button variant="minimal" text="Cancel" onClick={() => setOpen(false)} />
            </div>
          </form>
        </FormProvider>
      )}
    </Can>
  );
}
