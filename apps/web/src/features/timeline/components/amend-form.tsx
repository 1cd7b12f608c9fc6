import { Button, FormGroup, InputGroup, NumericInput } from '@blueprintjs/core';
import { ComplicationKind, type TimelineEvent } from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { useAmendComplication, useAmendTorque } from '../api/amend-entry';

/**
 * Amending a torque entry or a complication: a new version with its reason; the old entry stays
 * in the Timeline marked as amended. Torque: the corrected value; complication: corrected notes.
 */
export function AmendForm({ siteId, event, onDone }: { siteId: string; event: TimelineEvent; onDone: () => void }) {
  const torque = useAmendTorque(siteId);
  const complication = useAmendComplication(siteId);
  const [applied, setApplied] = useState<number | null>(event.appliedNcm);
  const [notes, setNotes] = useState(event.detail ?? '');
  const [reason, setReason] = useState('');
  const pending = torque.isPending || complication.isPending;
  const error = torque.error ?? complication.error;
  const fields = isApiError(error) ? error.fields : {};

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    try {
      if (event.kind === 'torque') {
        await torque.mutateAsync({ id: event.id, body: { appliedNcm: applied ?? Number.NaN, performedAt: event.at, amendmentReason: reason } });
      } else {
        const kind = ComplicationKind.parse(event.code);
        await complication.mutateAsync({ id: event.id, body: { kind, occurredOn: event.at.slice(0, 10), componentInstanceId: event.componentInstanceId, notes: notes || null, amendmentReason: reason } });
      }
      onDone();
    } catch {
      // shown beside the fields
    }
  };

  return (
    <form className="amend-form" onSubmit={submit} aria-label="Amend this entry" noValidate>
      {event.kind === 'torque' ? (
        <FormGroup label="Corrected torque (N·cm)" labelFor={`amend-${event.id}`} intent={fields.appliedNcm ? 'danger' : 'none'} helperText={fields.appliedNcm}>
          <NumericInput buttonPosition="none" id={`amend-${event.id}`} min={TORQUE_NCM_RANGE.min} max={TORQUE_NCM_RANGE.max} value={applied ?? ''} onValueChange={(v) => setApplied(Number.isFinite(v) ? v : null)} />
        </FormGroup>
      ) : (
        <FormGroup label="Corrected notes" labelFor={`amend-${event.id}`}>
          <InputGroup id={`amend-${event.id}`} value={notes} onValueChange={setNotes} />
        </FormGroup>
      )}
      <FormGroup label="Reason for the amendment" labelFor={`amend-reason-${event.id}`} intent={fields.amendmentReason ? 'danger' : 'none'} helperText={fields.amendmentReason}>
        <InputGroup id={`amend-reason-${event.id}`} value={reason} onValueChange={setReason} />
      </FormGroup>
      {error && Object.keys(fields).length === 0 && <p className="planner-error" role="alert">{error.message}</p>}
      <Button type="submit" small intent="primary" text="Save amendment" loading={pending} />
      <Button small variant="minimal" text="Cancel" onClick={onDone} />
    </form>
  );
}
