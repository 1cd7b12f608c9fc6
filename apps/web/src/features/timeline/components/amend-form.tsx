import { InputGroup } from '@blueprintjs/core';
import {
  ComplicationAmendmentBody,
  type ComplicationKind,
  type TimelineEvent,
  TorqueAmendmentBody,
} from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { useMemo } from 'react';
import type { z } from 'zod';
import {
  AmendmentForm,
  applyServerErrors,
  draftSchema,
  FormField,
  NumberInput,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useAmendComplication, useAmendTorque } from '../api/amend-entry';
import { runMutation } from '../../../lib/run-mutation';
import './timeline.css';

type TorqueAmendment = z.output<typeof TorqueAmendmentBody>;
type ComplicationAmendment = z.output<typeof ComplicationAmendmentBody>;

interface AmendDraft {
  /** Torque: the corrected value. */
  appliedNcm: number | null;
  /** Complication: the corrected notes. */
  notes: string;
  amendmentReason: string;
}

/**
 * Amending a torque entry or a complication: a new version with its reason; the old entry stays
 * in the Timeline marked as amended. Torque: the corrected value; complication: corrected notes.
 */
export function AmendForm({ siteId, event, onDone }: { siteId: string; event: TimelineEvent; onDone: () => void }) {
  const torque = useAmendTorque(siteId);
  const complication = useAmendComplication(siteId);
  const schema = useMemo(
    (): z.ZodType<TorqueAmendment | ComplicationAmendment, AmendDraft> =>
      event.kind === 'torque'
        ? // The wrench and the time, left out, are kept by the server.
          draftSchema(TorqueAmendmentBody, (d: AmendDraft) => ({
            appliedNcm: d.appliedNcm ?? Number.NaN,
            amendmentReason: d.amendmentReason,
          }))
        : draftSchema(ComplicationAmendmentBody, (d: AmendDraft) => ({
            // The entry's own kind and date, checked by the contract like every other value.
            kind: event.code as ComplicationKind,
            occurredOn: event.at.slice(0, 10),
            notes: d.notes || null,
            amendmentReason: d.amendmentReason,
          })),
    [event],
  );
  const form = useContractForm(schema, {
    appliedNcm: event.appliedNcm,
    notes: event.detail ?? '',
    amendmentReason: '',
  });
  const pending = torque.isPending || complication.isPending;

  const submit = (body: TorqueAmendment | ComplicationAmendment) => {
    const saved = { onSuccess: onDone, onError: (error: Error) => applyServerErrors(form.setError, error) };
    if ('appliedNcm' in body) runMutation(torque, { id: event.id, body }, saved);
    else runMutation(complication, { id: event.id, body }, saved);
  };
  return (
    <AmendmentForm form={form} onSubmit={submit} idPrefix={`amend-${event.id}`} pending={pending} onCancel={onDone}>
      {event.kind === 'torque' ? (
        <FormField name="appliedNcm" label="Corrected torque (N·cm)" labelFor={`amend-${event.id}`}>
          <NumberInput
            name="appliedNcm"
            buttonPosition="none"
            id={`amend-${event.id}`}
            min={TORQUE_NCM_RANGE.min}
            max={TORQUE_NCM_RANGE.max}
          />
        </FormField>
      ) : (
        <FormField name="notes" label="Corrected notes" labelFor={`amend-${event.id}`}>
          <InputGroup id={`amend-${event.id}`} {...withInputRef(form.register('notes'))} />
        </FormField>
      )}
    </AmendmentForm>
  );
}
