import { Button, Callout, InputGroup, Tag } from '@blueprintjs/core';
import { type CatalogueSystem, SystemGtinForm } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { useEnterSystemGtin } from '../api/catalogue-api';
import { runMutation } from '../../../lib/run-mutation';

/**
 * The GTINs the catalogue gives a system: learned from placements' UDIs or entered here. A
 * placement whose UDI carries a GTIN of another system is flagged in its Site file.
 */
export function SystemGtins({ system }: { system: CatalogueSystem }) {
  return (
    <div className="catalogue-gtins" data-testid={`system-gtins-${system.id}`}>
      <span className="muted">GTINs: </span>
      {system.gtins.length === 0 && <span className="muted">none known yet</span>}
      {system.gtins.map((g) => (
        <Tag key={g.gtin} minimal className="mono catalogue-gtins__tag">
          {g.gtin} {g.entered ? '' : '(learned from a placement)'}
        </Tag>
      ))}
      <Can I="update" a="Catalogue">
        <EnterGtinForm systemId={system.id} systemName={system.name} />
      </Can>
    </div>
  );
}

function EnterGtinForm({ systemId, systemName }: { systemId: string; systemName: string }) {
  const enter = useEnterSystemGtin();
  const form = useContractForm(SystemGtinForm, { gtin: '' }, { keepDraft: false });
  const submit = ({ gtin }: SystemGtinForm) =>
    runMutation(
      enter,
      { id: systemId, gtin },
      { onSuccess: () => form.reset({ gtin: '' }), onError: (error) => applyServerErrors(form.setError, error) },
    );
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="catalogue-gtins__form"
        aria-label={`Enter a GTIN of ${systemName}`}
        noValidate
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
      >
        <FormField name="gtin" label="GTIN from the label" labelFor={`gtin-${systemId}`}>
          {(a11y) => (
            <InputGroup
              small
              id={`gtin-${systemId}`}
              inputMode="numeric"
              {...a11y}
              {...withInputRef(form.register('gtin'))}
            />
          )}
        </FormField>
        <Button small type="submit" icon="add" loading={enter.isPending}>
          Give this system
        </Button>
        {message && (
          <Callout intent="danger" role="alert">
            {message}
          </Callout>
        )}
      </form>
    </FormProvider>
  );
}
