import '../components/outcomes.css';
import { AnchorButton, Button, HTMLSelect, HTMLTable, InputGroup, NonIdealState, Tag } from '@blueprintjs/core';
import { LOT_LOOKUP_KINDS, type LotLookupKind, LotLookupQuery } from '@torquetrail/contracts';
import { useEffect, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDate } from '../../../lib/dates';
import { applyServerErrors, FormField, useContractForm, withInputRef } from '../../../lib/forms';
import { isApiError } from '../../../lib/api-client';
import { LOT_ITEM_KIND_LABEL, LOT_LOOKUP_KIND_HELP, LOT_LOOKUP_KIND_LABEL } from '../../../lib/labels';
import { lotSearch, useLotLookup } from '../api/outcomes-api';
import { ChartNumber } from '../../../lib/components/chart-number';

/** /lot-lookup: which patients received an implant or part named by a field safety notice. */
export function LotLookupRoute() {
  const form = useContractForm(LotLookupQuery, { by: 'lot', q: '' }, { keepDraft: false });
  const [query, setQuery] = useState<LotLookupQuery | null>(null);
  const found = useLotLookup(query);
  const by: LotLookupKind = form.watch('by') as LotLookupKind;
  useEffect(() => {
    if (found.isError && isApiError(found.error, 400)) applyServerErrors(form.setError, found.error);
  }, [found.isError, found.error, form.setError]);

  return (
    <div className="lot-lookup">
      <title>Lot look-up · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Lot look-up' }]} />
      <h1 className="page-title">Lot look-up</h1>
      <p>
        Which patients received an implant or a part of a given lot, GTIN or catalogue reference: the question a
        manufacturer&apos;s field safety notice asks. Only this practice&apos;s patients are searched.
      </p>
      <FormProvider {...form}>
        <form
          className="lot-lookup__form"
          aria-label="Look up a lot"
          noValidate
          onSubmit={(e) => void form.handleSubmit((q) => setQuery({ by: q.by, q: q.q }))(e)}
        >
          <FormField name="by" label="Look up by" labelFor="lot-by">
            <HTMLSelect id="lot-by" {...form.register('by')}>
              {LOT_LOOKUP_KINDS.map((k) => (
                <option key={k} value={k}>
                  {LOT_LOOKUP_KIND_LABEL[k]}
                </option>
              ))}
            </HTMLSelect>
          </FormField>
          <FormField name="q" label={LOT_LOOKUP_KIND_LABEL[by]} labelFor="lot-q" help={LOT_LOOKUP_KIND_HELP[by]}>
            {(a11y) => <InputGroup id="lot-q" {...a11y} {...withInputRef(form.register('q'))} />}
          </FormField>
          <Button type="submit" intent="primary" text="Look up" loading={found.isFetching} />
        </form>
      </FormProvider>
      {query === null ? null : found.isPending ? (
        <LoadingState label="Looking up" />
      ) : found.isError ? (
        isApiError(found.error, 400) ? null : (
          <ErrorState title="The look-up failed" error={found.error} onRetry={() => void found.refetch()} />
        )
      ) : found.data.rows.length === 0 ? (
        <NonIdealState icon="search" title="No implant or part of this practice matches" />
      ) : (
        <>
          <p role="status">
            {found.data.rows.length} found
            {found.data.gtin ? ` for GTIN ${found.data.gtin}` : ''}
            {found.data.lot ? ` for lot ${found.data.lot}` : ''}
            {found.data.part ? ` for reference ${found.data.part}` : ''}.{' '}
            <AnchorButton
              icon="download"
              variant="minimal"
              href={`/api/lot-lookup/csv${lotSearch(query)}`}
              text="Download as CSV"
            />
          </p>
          <HTMLTable className="outcomes-table" striped compact data-testid="lot-lookup-table">
            <thead>
              <tr>
                <th scope="col">Patient</th>
                <th scope="col">Site</th>
                <th scope="col">Part</th>
                <th scope="col">Lot</th>
                <th scope="col">Installed on</th>
                <th scope="col">Now</th>
              </tr>
            </thead>
            <tbody>
              {found.data.rows.map((r) => (
                <tr key={`${r.item}:${r.siteId}:${r.installedOn}:${r.part}`}>
                  <td>
                    <Link to={`/patients/${r.patientId}`}>{r.patientName}</Link> (<ChartNumber value={r.chartNumber} />)
                  </td>
                  <td>
                    <Link to={`/patients/${r.patientId}/sites/${r.siteId}`}>{r.fdi}</Link>
                  </td>
                  <td>
                    {LOT_ITEM_KIND_LABEL[r.item]}: {r.part}
                    {r.referenceCode ? ` [${r.referenceCode}]` : ''}
                  </td>
                  <td>{r.lot ?? '—'}</td>
                  <td>{formatDate(r.installedOn)}</td>
                  <td>
                    {r.inPlace ? (
                      <Tag intent="warning">Still in place</Tag>
                    ) : (
                      <Tag minimal>Removed {r.removedOn ? formatDate(r.removedOn) : ''}</Tag>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </HTMLTable>
        </>
      )}
    </div>
  );
}
