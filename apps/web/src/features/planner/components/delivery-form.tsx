import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { DeliveryBody, type RestorationDetail } from '@torquetrail/contracts';
import { useMemo } from 'react';
import { FormProvider } from 'react-hook-form';
import { localToday } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  errorAt,
  FieldError,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useDeliver } from '../api/planner-api';
import { runMutation } from '../../../lib/run-mutation';

interface DeliveryDraft {
  /** One lot per row, as typed. */
  lots: string[];
  deliveredOn: string;
  impressionTakenOn: string;
}

/**
 * Delivery: every planned part that stays in the mouth (not the impression copings), each with
 * its lot number (required where the catalogue says so). Saved in one transaction by the API.
 */
export function DeliveryForm({
  restoration,
  onDone,
}: {
  restoration: RestorationDetail;
  /** `true` once delivered: the flow goes on to the seating torques. */
  onDone: (delivered: boolean) => void;
}) {
  const rows = useMemo(
    () =>
      restoration.sites.flatMap((s) =>
        s.components.filter((c) => c.kind !== 'impression-coping').map((c) => ({ site: s, part: c })),
      ),
    [restoration],
  );
  const schema = useMemo(
    () =>
      draftSchema(DeliveryBody, (d: DeliveryDraft) => ({
        deliveredOn: d.deliveredOn,
        impressionTakenOn: d.impressionTakenOn || null,
        parts: rows.map((r, i) => ({ siteId: r.site.siteId, componentId: r.part.id, lot: d.lots[i] || null })),
      })),
    [rows],
  );
  const form = useContractForm(schema, { lots: rows.map(() => ''), deliveredOn: localToday(), impressionTakenOn: '' });
  const deliver = useDeliver();

  const submit = (body: DeliveryBody) =>
    runMutation(
      deliver,
      { id: restoration.id, body },
      { onSuccess: () => onDone(true), onError: (error) => applyServerErrors(form.setError, error) },
    );
  const { errors } = form.formState;
  const message = formErrorMessage(errors, 'always');

  if (rows.length === 0)
    return (
      <Callout intent="primary">
        The plan names no parts to deliver. Amend the plan to choose them from the catalogue.
      </Callout>
    );
  return (
    <FormProvider {...form}>
      <form
        className="delivery-form"
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
        aria-label="Deliver the restoration"
        data-testid="delivery-form"
        noValidate
      >
        <table>
          <thead>
            <tr>
              <th>Site</th>
              <th>Part</th>
              <th>Lot</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={`${r.site.siteId}:${r.part.id}`}>
                <td>{r.site.fdi}</td>
                <td>
                  {r.part.name} [{r.part.referenceCode}]
                </td>
                <td>
                  <InputGroup
                    aria-label={`Lot of ${r.part.name} at ${r.site.fdi}`}
                    placeholder={r.part.requiresLot ? 'required' : 'optional'}
                    intent={errorAt(errors, `parts.${i}.lot`) ? 'danger' : 'none'}
                    {...withInputRef(form.register(`lots.${i}`))}
                  />
                  <FieldError name={`parts.${i}.lot`} className="planner-error" />
                  <FieldError name={`parts.${i}.componentId`} className="planner-error" />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <label>
          Impression taken on <DateField name="impressionTakenOn" />
        </label>
        <FieldError name="impressionTakenOn" className="planner-error" />
        <label>
          Delivered on <DateField name="deliveredOn" intent={errorAt(errors, 'deliveredOn') ? 'danger' : 'none'} />
        </label>
        <FieldError name="deliveredOn" className="planner-error" />
        {message && (
          <Callout intent="danger" role="alert" compact>
            {message}
          </Callout>
        )}
        <Button
          type="submit"
          intent="primary"
          text="Record delivery"
          loading={deliver.isPending}
          data-testid="record-delivery"
        />
      </form>
    </FormProvider>
  );
}
