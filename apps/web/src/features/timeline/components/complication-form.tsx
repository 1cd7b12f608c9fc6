import { Button, Callout, FormGroup, HTMLSelect, InputGroup, TextArea } from '@blueprintjs/core';
import { type ComplicationKind, type StackPart } from '@torquetrail/contracts';
import { type FormEvent, useState } from 'react';
import { Can } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { COMPLICATION_KIND_LABEL } from '../../../lib/clinical-labels';
import { useRecordComplication } from '../api/record-complication';

/** "Record complication": linked to the site and, optionally, one of its parts. */
export function ComplicationPanel({ siteId, parts }: { siteId: string; parts: StackPart[] }) {
  const [open, setOpen] = useState(false);
  const [kind, setKind] = useState<ComplicationKind>('screw-loosening');
  const [partId, setPartId] = useState('');
  const [occurredOn, setOccurredOn] = useState(() => new Date().toISOString().slice(0, 10));
  const [notes, setNotes] = useState('');
  const record = useRecordComplication(siteId);
  const fields = isApiError(record.error) ? record.error.fields : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    record.mutate({ siteId, kind, componentInstanceId: partId || null, occurredOn, notes: notes || null }, { onSuccess: () => setOpen(false) });
  };
  return (
    <Can I="create" a="Complication">
      <Button icon="warning-sign" text="Record complication" onClick={() => setOpen((v) => !v)} aria-expanded={open} data-testid="record-complication" />
      {open && (
        <form onSubmit={submit} className="torque-form complication-form" aria-label="Record complication" noValidate>
          <FormGroup label="Complication" labelFor="complication-kind">
            <HTMLSelect id="complication-kind" value={kind} onChange={(e) => setKind(e.currentTarget.value as ComplicationKind)}>
              {Object.entries(COMPLICATION_KIND_LABEL).map(([v, t]) => <option key={v} value={v}>{t}</option>)}
            </HTMLSelect>
          </FormGroup>
          <FormGroup label="Part (optional)" labelFor="complication-part" intent={fields.componentInstanceId ? 'danger' : 'none'} helperText={fields.componentInstanceId}>
            <HTMLSelect id="complication-part" value={partId} onChange={(e) => setPartId(e.currentTarget.value)}>
              <option value="">The site as a whole</option>
              {parts.map((p) => <option key={p.instanceId} value={p.instanceId}>{p.name} ({p.referenceCode})</option>)}
            </HTMLSelect>
          </FormGroup>
          <FormGroup label="Date" labelFor="complication-date" intent={fields.occurredOn ? 'danger' : 'none'} helperText={fields.occurredOn}>
            <InputGroup id="complication-date" type="date" value={occurredOn} onValueChange={setOccurredOn} />
          </FormGroup>
          <FormGroup label="Notes" labelFor="complication-notes">
            <TextArea id="complication-notes" value={notes} onChange={(e) => setNotes(e.currentTarget.value)} fill />
          </FormGroup>
          {record.isError && Object.keys(fields).length === 0 && <Callout intent="danger" role="alert" compact>{record.error.message}</Callout>}
          <div className="torque-form__actions">
            <Button type="submit" intent="primary" text="Save complication" loading={record.isPending} />
            <Button variant="minimal" text="Cancel" onClick={() => setOpen(false)} />
          </div>
        </form>
      )}
    </Can>
  );
}
