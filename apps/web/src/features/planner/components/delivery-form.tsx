import { Button, Callout, InputGroup } from '@blueprintjs/core';
import type { RestorationDetail } from '@torquetrail/contracts';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { useDeliver } from '../api/planner-api';

const today = () => new Date().toISOString().slice(0, 10);

/**
 * Delivery: every planned part that stays in the mouth (not the impression copings), each with
 * its lot number (required where the catalogue says so). Saved in one transaction by the API.
 */
export function DeliveryForm({ restoration, onDone }: { restoration: RestorationDetail; onDone: () => void }) {
  const rows = restoration.sites.flatMap((s) => s.components.filter((c) => c.kind !== 'impression-coping').map((c) => ({ site: s, part: c })));
  const [lots, setLots] = useState<string[]>(rows.map(() => ''));
  const [deliveredOn, setDeliveredOn] = useState(today);
  const [impressionTakenOn, setImpressionTakenOn] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const deliver = useDeliver();

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setMessage(null);
    try {
      await deliver.mutateAsync({
        id: restoration.id,
        body: { deliveredOn, impressionTakenOn: impressionTakenOn || null, parts: rows.map((r, i) => ({ siteId: r.site.siteId, componentId: r.part.id, lot: lots[i] || null })) },
      });
      onDone();
    } catch (error) {
      if (isApiError(error)) {
        setFields(error.fields);
        setMessage(error.message);
      }
    }
  };

  if (rows.length === 0) return <Callout intent="primary">The plan names no parts to deliver. Amend the plan to choose them from the catalogue.</Callout>;
  return (
    <form className="delivery-form" onSubmit={submit} aria-label="Deliver the restoration" data-testid="delivery-form" noValidate>
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
                  value={lots[i]}
                  placeholder={r.part.requiresLot ? 'required' : 'optional'}
                  intent={fields[`parts.${i}.lot`] ? 'danger' : 'none'}
                  onValueChange={(v) => setLots(lots.map((l, j) => (j === i ? v : l)))}
                />
                {fields[`parts.${i}.lot`] && <span className="planner-error" data-testid={`error-parts.${i}.lot`}>{fields[`parts.${i}.lot`]}</span>}
                {fields[`parts.${i}.componentId`] && <span className="planner-error">{fields[`parts.${i}.componentId`]}</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <label>
        Impression taken on <InputGroup type="date" value={impressionTakenOn} onValueChange={setImpressionTakenOn} />
      </label>
      <label>
        Delivered on <InputGroup type="date" value={deliveredOn} onValueChange={setDeliveredOn} intent={fields.deliveredOn ? 'danger' : 'none'} />
      </label>
      {message && (
        <Callout intent="danger" role="alert" compact>
          {message}
        </Callout>
      )}
      <Button type="submit" intent="primary" text="Record delivery" loading={deliver.isPending} data-testid="record-delivery" />
    </form>
  );
}
