import { Button, Callout, FormGroup, HTMLSelect, InputGroup, NumericInput, TextArea } from '@blueprintjs/core';
import { IMPLANT_LENGTH_MM_RANGE, INSERTION_TORQUE_NCM_RANGE, ISQ_RANGE, type LoadingProtocol, PlacementBody, type PlacementOptionsReply } from '@torquetrail/contracts';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { LOADING_PROTOCOL_LABEL } from '../../../lib/clinical-labels';
import { fieldsFromIssues } from '../../../lib/form-errors';
import { useRecordPlacement } from '../api/record-placement';
import { checkUdiForPlacement } from '@torquetrail/domain';
import { readUdi, UdiField } from './udi-field';

const localToday = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 10);
};

const num = (v: number) => (Number.isFinite(v) ? v : null);

/**
 * What was placed: platform (from the site's practice catalogue), date, length, lot and UDI,
 * insertion torque, ISQ, grafting, loading, axis, the healing abutment or cover screw, notes.
 * The server checks everything again; its `fields` show beside each field.
 */
export function PlacementForm({ patientId, siteId, options, onDone }: { patientId: string; siteId: string; options: PlacementOptionsReply; onDone: () => void }) {
  const [platformId, setPlatformId] = useState('');
  const [placedOn, setPlacedOn] = useState(localToday);
  const [lengthMm, setLengthMm] = useState<number | null>(null);
  const [lot, setLot] = useState('');
  const [udi, setUdi] = useState('');
  const [torque, setTorque] = useState<number | null>(null);
  const [isq, setIsq] = useState<number | null>(null);
  const [grafting, setGrafting] = useState('');
  const [loading, setLoading] = useState<LoadingProtocol | ''>('');
  const [axis, setAxis] = useState<[number | null, number | null, number | null]>([null, null, null]);
  const [closureId, setClosureId] = useState('');
  const [closureLot, setClosureLot] = useState('');
  const [notes, setNotes] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const record = useRecordPlacement(patientId, siteId);

  const platforms = options.systems.flatMap((s) => s.platforms.map((p) => ({ ...p, system: s })));
  const platform = platforms.find((p) => p.id === platformId);
  const closures = platform?.components ?? [];
  // The same check as the server's: a typed lot that differs from the scanned one, shown live.
  const reading = readUdi(udi);
  const lotFinding = reading?.ok ? checkUdiForPlacement(reading.udi, { placedOn, lot }).find((f) => f.field === 'lot') : undefined;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    const axisGiven = axis.some((a) => a !== null);
    const body: PlacementBody = {
      platformId,
      placedOn,
      lengthMm: lengthMm ?? Number.NaN,
      lot: lot || null,
      udi: udi || null,
      insertionTorqueNcm: torque,
      stabilityIsq: isq,
      grafting: grafting || null,
      loadingProtocol: loading || null,
      axis: axisGiven ? { x: axis[0] ?? 0, y: axis[1] ?? 0, z: axis[2] ?? 0 } : null,
      closureComponentId: closureId || null,
      closureLot: closureId ? closureLot || null : null,
      notes: notes || null,
    };
    const parsed = PlacementBody.safeParse(body);
    if (!parsed.success) return setFields(fieldsFromIssues(parsed.error.issues));
    setFields({});
    try {
      await record.mutateAsync(body);
      onDone();
    } catch (error) {
      if (isApiError(error)) setFields({ ...error.fields, ...(Object.keys(error.fields).length === 0 ? { '(form)': error.message } : {}) });
    }
  };

  const err = (key: string) => (fields[key] ? { intent: 'danger' as const, helperText: <span data-testid={`error-${key}`}>{fields[key]}</span> } : {});
  const axisInput = (i: 0 | 1 | 2, label: string) => (
    <NumericInput
      buttonPosition="none"
      id={`placement-axis-${label}`}
      aria-label={`Axis ${label}`}
      placeholder={label}
      value={axis[i] ?? ''}
      onValueChange={(v) => setAxis((a) => Object.assign([...a], { [i]: num(v) }) as typeof a)}
      stepSize={0.1}
      minorStepSize={0.01}
      majorStepSize={1}
    />
  );

  return (
    <form className="placement-form" onSubmit={submit} aria-label="Record placement" data-testid="placement-form" noValidate>
      <Callout intent="warning" icon="info-sign" compact>
        {options.caution}
      </Callout>
      <FormGroup label="Platform" labelFor="placement-platform" {...err('platformId')}>
        <HTMLSelect id="placement-platform" value={platformId} onChange={(e) => (setPlatformId(e.currentTarget.value), setClosureId(''))} fill>
          <option value="">Choose the platform…</option>
          {options.systems.map((s) => (
            <optgroup key={s.id} label={`${s.name} (${s.manufacturer})`}>
              {s.platforms.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </optgroup>
          ))}
        </HTMLSelect>
      </FormGroup>
      <div className="placement-form__row">
        <FormGroup label="Placed on" labelFor="placement-date" {...err('placedOn')}>
          <InputGroup id="placement-date" type="date" value={placedOn} max={localToday()} onValueChange={setPlacedOn} />
        </FormGroup>
        <FormGroup label="Implant length (mm)" labelFor="placement-length" {...err('lengthMm')}>
          <NumericInput buttonPosition="none" id="placement-length" min={IMPLANT_LENGTH_MM_RANGE.min} max={IMPLANT_LENGTH_MM_RANGE.max} stepSize={0.5} value={lengthMm ?? ''} onValueChange={(v) => setLengthMm(num(v))} allowNumericCharactersOnly />
        </FormGroup>
      </div>
      <UdiField
        value={udi}
        placedOn={placedOn}
        serverError={fields.udi}
        onChange={(text, reading) => {
          setUdi(text);
          if (reading?.ok && reading.udi.lot) setLot(reading.udi.lot);
        }}
      />
      <FormGroup label="Lot" labelFor="placement-lot" subLabel="Filled from the UDI when it has one" {...(fields.lot ? err('lot') : lotFinding ? { intent: 'danger' as const, helperText: <span data-testid="error-lot">{lotFinding.message}</span> } : {})}>
        <InputGroup id="placement-lot" value={lot} onValueChange={setLot} className="mono" autoComplete="off" />
      </FormGroup>
      <div className="placement-form__row">
        <FormGroup label="Insertion torque (N·cm)" labelFor="placement-torque" {...err('insertionTorqueNcm')}>
          <NumericInput buttonPosition="none" id="placement-torque" min={INSERTION_TORQUE_NCM_RANGE.min} max={INSERTION_TORQUE_NCM_RANGE.max} value={torque ?? ''} onValueChange={(v) => setTorque(num(v))} allowNumericCharactersOnly />
        </FormGroup>
        <FormGroup label="Stability (ISQ)" labelFor="placement-isq" {...err('stabilityIsq')}>
          <NumericInput buttonPosition="none" id="placement-isq" min={ISQ_RANGE.min} max={ISQ_RANGE.max} value={isq ?? ''} onValueChange={(v) => setIsq(num(v))} allowNumericCharactersOnly />
        </FormGroup>
        <FormGroup label="Loading protocol" labelFor="placement-loading" {...err('loadingProtocol')}>
          <HTMLSelect id="placement-loading" value={loading} onChange={(e) => setLoading(e.currentTarget.value as LoadingProtocol | '')}>
            <option value="">Not recorded</option>
            {Object.entries(LOADING_PROTOCOL_LABEL).map(([value, text]) => (
              <option key={value} value={value}>
                {text}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
      </div>
      <FormGroup label="Grafting" labelFor="placement-grafting" {...err('grafting')}>
        <InputGroup id="placement-grafting" value={grafting} onValueChange={setGrafting} placeholder="e.g. none, xenograft buccal contour, sinus lift" />
      </FormGroup>
      <FormGroup label="Implant axis (optional direction vector x, y, z)" labelFor="placement-axis-x" {...err('axis')}>
        <div className="placement-form__axis">
          {axisInput(0, 'x')}
          {axisInput(1, 'y')}
          {axisInput(2, 'z')}
        </div>
      </FormGroup>
      <div className="placement-form__row">
        <FormGroup label="Healing abutment or cover screw" labelFor="placement-closure" subLabel="Hand-tight: no torque is logged" {...err('closureComponentId')}>
          <HTMLSelect id="placement-closure" value={closureId} onChange={(e) => setClosureId(e.currentTarget.value)} disabled={!platform}>
            <option value="">None</option>
            {closures.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} [{c.referenceCode}]
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        {closureId && (
          <FormGroup label="Lot of that part" labelFor="placement-closure-lot" {...err('closureLot')}>
            <InputGroup id="placement-closure-lot" value={closureLot} onValueChange={setClosureLot} className="mono" autoComplete="off" />
          </FormGroup>
        )}
      </div>
      <FormGroup label="Notes" labelFor="placement-notes" {...err('notes')}>
        <TextArea id="placement-notes" value={notes} onChange={(e) => setNotes(e.currentTarget.value)} fill />
      </FormGroup>
      {fields['(form)'] && (
        <Callout intent="danger" role="alert" compact>
          {fields['(form)']}
        </Callout>
      )}
      <div className="placement-form__actions">
        <Button type="submit" intent="primary" text="Save placement" loading={record.isPending} data-testid="save-placement" />
        <Button variant="minimal" text="Cancel" onClick={onDone} />
      </div>
    </form>
  );
}
