import { Button, Callout, HTMLSelect } from '@blueprintjs/core';
import { AddSiteBody, type ArchSite } from '@torquetrail/contracts';
import { formatTooth, TOOTH_POSITIONS_PERMANENT } from '@torquetrail/domain';
import { useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { applyServerErrors, draftSchema, FormField, formErrorMessage, useContractForm } from '../../../lib/forms';
import type { ToothSystem } from '../../../lib/tooth-system';
import { useAddSite } from '../api/add-site';
import { runMutation } from '../../../lib/run-mutation';

// No position chosen is no number: the contract answers "Choose a tooth position".
const schema = draftSchema(AddSiteBody, (d: { fdi: string }) => ({ fdi: d.fdi ? Number(d.fdi) : Number.NaN }));

/** A small form to plan an implant site at a permanent position that has no live site. */
export function AddSiteControl({
  patientId,
  sites,
  system,
}: {
  patientId: string;
  sites: ArchSite[];
  system: ToothSystem;
}) {
  const taken = new Set(sites.map((s) => s.fdi));
  const free = TOOTH_POSITIONS_PERMANENT.filter((fdi) => !taken.has(fdi));
  const form = useContractForm(schema, { fdi: '' });
  const [added, setAdded] = useState<string | null>(null);
  const add = useAddSite(patientId);

  const submit = (body: AddSiteBody) =>
    runMutation(add, body, {
      onSuccess: (site) => {
        setAdded(`Planned site ${formatTooth(site.fdi, system)} added`);
        form.setValue('fdi', '');
      },
      onError: (error) => applyServerErrors(form.setError, error),
    });

  return (
    <FormProvider {...form}>
      <form
        className="add-site"
        onSubmit={(event) => {
          setAdded(null);
          void form.handleSubmit(submit)(event);
        }}
        aria-label="Plan an implant site"
        data-testid="add-site"
      >
        {/* One field: a refusal that names no field is shown beside it too. */}
        <FormField
          name="fdi"
          live={formErrorMessage(form.formState.errors, 'always')}
          label="Add planned site"
          labelFor="add-site-position"
          inline
        >
          <HTMLSelect id="add-site-position" {...form.register('fdi')}>
            <option value="">Position…</option>
            {free.map((p) => (
              <option key={p} value={p}>
                {formatTooth(p, system)}
              </option>
            ))}
          </HTMLSelect>
          <Button type="submit" text="Add" loading={add.isPending} />
        </FormField>
        {added && (
          <Callout intent="success" compact role="status">
            {added}
          </Callout>
        )}
      </form>
    </FormProvider>
  );
}
