import { Button, Callout, HTMLSelect, InputGroup, Radio, RadioGroup, TextArea } from '@blueprintjs/core';
import {
  type ImpressionBody,
  ImpressionBody as ImpressionContract,
  type RestorationSiteDetail,
} from '@torquetrail/contracts';
import { formatTooth, type ImpressionMethod, type Retention } from '@torquetrail/domain';
import { useMemo } from 'react';
import { FormProvider } from 'react-hook-form';
import { COPING_LEVEL_LABEL, IMPRESSION_COPING_LABEL, IMPRESSION_METHOD_LABEL } from '../../../lib/clinical-labels';
import { localToday } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import type { ToothSystem } from '../../../lib/tooth-system';
import { useCatalogue } from '../../catalogue';
import { useRecordImpression } from '../api/impressions-api';
import { platformKeyOf, scanBodyIssues, scanBodyOptions, suitsSite } from './scan-body-choice';

interface ImpressionDraft {
  method: ImpressionMethod;
  takenOn: string;
  /** Per site, in the restoration's order: the chosen scan body ('' = none yet) and its lot as typed. */
  scanBodies: { componentId: string; lot: string }[];
  note: string;
}

/**
 * Record a restoration's impression: analog (the copings the plan chose per site), or digital with
 * a scan body per site (of the site's platform) and its lot. Errors stand beside their field.
 */
export function ImpressionForm({
  restorationId,
  sites,
  system,
  retention,
  onDone,
}: {
  restorationId: string;
  sites: RestorationSiteDetail[];
  system: ToothSystem;
  /** The restoration's retention: it decides the level (implant or multi-unit) a scan body must record. */
  retention?: Retention;
  onDone: () => void;
}) {
  const catalogue = useCatalogue();
  const options = useMemo(() => (catalogue.data ? scanBodyOptions(catalogue.data) : []), [catalogue.data]);
  const schema = useMemo(
    () =>
      draftSchema(ImpressionContract, (d: ImpressionDraft) => ({
        method: d.method,
        takenOn: d.takenOn,
        note: d.note,
        scanBodies:
          d.method === 'digital'
            ? sites.map((s, i) => ({
                siteId: s.siteId,
                componentId: d.scanBodies[i]?.componentId ?? '',
                lot: d.scanBodies[i]?.lot ?? '',
              }))
            : [],
      })).superRefine((body, ctx) => {
        for (const issue of scanBodyIssues(body, sites, options, retention))
          ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
      }),
    [sites, options, retention],
  );
  const form = useContractForm(schema, {
    method: 'digital',
    takenOn: localToday(),
    scanBodies: sites.map(() => ({ componentId: '', lot: '' })),
    note: '',
  });
  const record = useRecordImpression(restorationId);
  const method = form.watch('method');
  const { errors } = form.formState;
  const message = formErrorMessage(errors, 'always');

  const submit = (body: ImpressionBody) =>
    runMutation(record, body, {
      onSuccess: onDone,
      onError: (error) => applyServerErrors(form.setError, error),
    });

  if (catalogue.isPending) return <p>Loading the catalogue…</p>;
  if (catalogue.isError) return <Callout intent="danger">The catalogue could not be loaded.</Callout>;
  return (
    <FormProvider {...form}>
      <form
        className="impression-form"
        aria-label="Record the impression"
        data-testid="impression-form"
        noValidate
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
      >
        <FormField name="method" label="How was it taken?">
          <RadioGroup
            selectedValue={method}
            onChange={(event) =>
              form.setValue('method', event.currentTarget.value === 'analog' ? 'analog' : 'digital', {
                shouldDirty: true,
              })
            }
          >
            <Radio value="digital" label={IMPRESSION_METHOD_LABEL.digital} />
            <Radio value="analog" label={IMPRESSION_METHOD_LABEL.analog} />
          </RadioGroup>
        </FormField>
        <FormField name="takenOn" label="Date taken" labelFor="impression-taken-on">
          {(a11y) => <DateField name="takenOn" id="impression-taken-on" intent={a11y.intent} />}
        </FormField>
        {method === 'analog' ? (
          <ul aria-label="Copings of the plan">
            {sites.map((s) => (
              <li key={s.siteId}>
                {formatTooth(s.fdi, system)}: {IMPRESSION_COPING_LABEL[s.impressionCoping].toLowerCase()}
                {s.components
                  .filter((c) => c.kind === 'impression-coping')
                  .map((c) => ` — ${c.name} (${c.referenceCode})`)
                  .join('')}
              </li>
            ))}
          </ul>
        ) : (
          <fieldset className="impression-form__sites">
            <legend>Scan body at each site</legend>
            {options.length === 0 && (
              <Callout intent="warning" compact>
                The catalogue has no scan body yet: add one (kind “scan body”) for each platform.
              </Callout>
            )}
            {sites.map((s, i) => {
              const fits = options.filter((o) => suitsSite(o, s, retention));
              // Of the site's platform but of the other level (implant or multi-unit): listed apart.
              const otherLevel = options.filter((o) => !fits.includes(o) && o.platformKey === platformKeyOf(s));
              const others = options.filter((o) => !fits.includes(o) && !otherLevel.includes(o));
              const tooth = formatTooth(s.fdi, system);
              return (
                <div key={s.siteId} className="impression-form__site" data-testid={`scan-body-site-${s.fdi}`}>
                  <FormField
                    name={`scanBodies.${i}.componentId`}
                    label={`Site ${tooth} (${s.platformName ?? 'platform unknown'})`}
                    labelFor={`scan-body-${s.siteId}`}
                  >
                    {(a11y) => (
                      <HTMLSelect
                        id={`scan-body-${s.siteId}`}
                        aria-invalid={a11y['aria-invalid']}
                        aria-describedby={a11y['aria-describedby']}
                        {...form.register(`scanBodies.${i}.componentId`)}
                      >
                        <option value="">Choose the scan body…</option>
                        <optgroup label={`For ${s.platformName ?? 'this platform'}`}>
                          {fits.map((o) => (
                            <option key={o.id} value={o.id}>
                              {o.name} ({o.referenceCode})
                            </option>
                          ))}
                        </optgroup>
                        {otherLevel.length > 0 && (
                          <optgroup label="Another level">
                            {otherLevel.map((o) => (
                              <option key={o.id} value={o.id}>
                                {o.name} ({o.referenceCode}) —{' '}
                                {COPING_LEVEL_LABEL[o.copingLevel ?? 'implant'].toLowerCase()}
                              </option>
                            ))}
                          </optgroup>
                        )}
                        {others.length > 0 && (
                          <optgroup label="Other platforms">
                            {others.map((o) => (
                              <option key={o.id} value={o.id}>
                                {o.name} ({o.referenceCode}) — {o.platformName}
                              </option>
                            ))}
                          </optgroup>
                        )}
                      </HTMLSelect>
                    )}
                  </FormField>
                  <FormField
                    name={`scanBodies.${i}.lot`}
                    label={`Lot at ${tooth}`}
                    labelFor={`scan-body-lot-${s.siteId}`}
                  >
                    {(a11y) => (
                      <InputGroup
                        id={`scan-body-lot-${s.siteId}`}
                        {...a11y}
                        {...withInputRef(form.register(`scanBodies.${i}.lot`))}
                      />
                    )}
                  </FormField>
                </div>
              );
            })}
          </fieldset>
        )}
        <FormField name="note" label="Note (optional)" labelFor="impression-note">
          {(a11y) => <TextArea id="impression-note" fill rows={2} {...a11y} {...withInputRef(form.register('note'))} />}
        </FormField>
        {message && (
          <Callout intent="danger" role="alert" compact>
            {message}
          </Callout>
        )}
        <Button
          type="submit"
          intent="primary"
          text="Record the impression"
          loading={record.isPending}
          data-testid="record-impression"
        />
      </form>
    </FormProvider>
  );
}
