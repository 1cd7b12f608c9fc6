import { Button, Callout, FormGroup, HTMLSelect, InputGroup, NumericInput } from '@blueprintjs/core';
import { MANUFACTURER_CAUTION, type StackPart, TorqueBody, type TorqueReason } from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE, torqueVerdict } from '@torquetrail/domain';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { TORQUE_REASON_LABEL, TORQUE_VERDICT_LABEL, WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';
import { fieldsFromIssues } from '../../../lib/form-errors';
import { useLogTorque } from '../api/log-torque';
import { useWrenches } from '../api/wrenches';

const localNow = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

/**
 * Torque entry: which part, the applied value, the wrench, the reason and when. The spec and the
 * verdict (torqueVerdict from @torquetrail/domain, as on the server) show beside the value.
 */
export function TorqueForm({ siteId, parts, onDone }: { siteId: string; parts: StackPart[]; onDone: () => void }) {
  const torqueable = parts.filter((p) => p.torqueSpecNcm !== null);
  const [instanceId, setInstanceId] = useState(torqueable[0]?.instanceId ?? '');
  const [applied, setApplied] = useState<number | null>(null);
  const [wrenchId, setWrenchId] = useState('');
  const [reason, setReason] = useState<TorqueReason>('initial-seating');
  const [when, setWhen] = useState(localNow);
  const [lot, setLot] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const wrenches = useWrenches();
  const log = useLogTorque(siteId);
  const part = torqueable.find((p) => p.instanceId === instanceId);

  if (torqueable.length === 0) return <Callout intent="primary">No part of this site has a torque specification (healing abutments and cover screws are hand-tight).</Callout>;

  const inRange = applied !== null && applied >= TORQUE_NCM_RANGE.min && applied <= TORQUE_NCM_RANGE.max;
  const verdict = part && inRange ? torqueVerdict({ appliedNcm: applied, specNcm: part.torqueSpecNcm!, tolerancePct: part.tolerancePct }) : null;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    const body = {
      componentInstanceId: instanceId,
      appliedNcm: applied ?? Number.NaN,
      wrenchId: wrenchId || null,
      reason,
      performedAt: new Date(when).toISOString(),
      replacementLot: reason === 'screw-replaced' ? lot || null : null,
    };
    const parsed = TorqueBody.safeParse(body);
    if (!parsed.success) return setFields(fieldsFromIssues(parsed.error.issues));
    setFields({});
    try {
      await log.mutateAsync(body);
      onDone();
    } catch (error) {
      if (isApiError(error)) setFields({ ...error.fields, ...(Object.keys(error.fields).length === 0 ? { '(form)': error.message } : {}) });
    }
  };

  const err = (key: string) => (fields[key] ? { intent: 'danger' as const, helperText: fields[key] } : {});
  return (
    <form className="torque-form" onSubmit={submit} aria-label="Log torque" data-testid="torque-form" noValidate>
      <Callout intent="warning" icon="info-sign" compact>
        {MANUFACTURER_CAUTION}
      </Callout>
      <FormGroup label="Part" labelFor="torque-part" {...err('componentInstanceId')}>
        <HTMLSelect id="torque-part" value={instanceId} onChange={(e) => setInstanceId(e.currentTarget.value)} fill>
          {torqueable.map((p) => (
            <option key={p.instanceId} value={p.instanceId}>
              {p.name} ({p.referenceCode})
            </option>
          ))}
        </HTMLSelect>
      </FormGroup>
      <FormGroup label="Applied torque (N·cm)" labelFor="torque-applied" {...err('appliedNcm')}>
        <NumericInput buttonPosition="none" id="torque-applied" min={TORQUE_NCM_RANGE.min} max={TORQUE_NCM_RANGE.max} stepSize={0.5} minorStepSize={0.1} value={applied ?? ''} onValueChange={(v) => setApplied(Number.isFinite(v) ? v : null)} fill allowNumericCharactersOnly />
      </FormGroup>
      {part && (
        <p className="torque-form__spec" data-testid="torque-spec">
          Specification {part.torqueSpecNcm} N·cm ± {part.tolerancePct} %{verdict && <> · <strong data-testid="torque-live-verdict">{TORQUE_VERDICT_LABEL[verdict]}</strong></>}
        </p>
      )}
      <FormGroup label="Wrench" labelFor="torque-wrench" {...err('wrenchId')}>
        <HTMLSelect id="torque-wrench" value={wrenchId} onChange={(e) => setWrenchId(e.currentTarget.value)} fill>
          <option value="">Not recorded</option>
          {wrenches.data?.items.map((w) => (
            <option key={w.id} value={w.id}>
              {w.label} ({WRENCH_TYPE_LABEL[w.type].toLowerCase()}{w.lastCalibratedOn ? `, calibrated ${w.lastCalibratedOn}` : ', calibration not recorded'})
            </option>
          ))}
        </HTMLSelect>
      </FormGroup>
      <FormGroup label="Reason" labelFor="torque-reason" {...err('reason')}>
        <HTMLSelect id="torque-reason" value={reason} onChange={(e) => setReason(e.currentTarget.value as TorqueReason)} fill>
          {Object.entries(TORQUE_REASON_LABEL).map(([value, text]) => (
            <option key={value} value={value}>
              {text}
            </option>
          ))}
        </HTMLSelect>
      </FormGroup>
      {reason === 'screw-replaced' && (
        <FormGroup label="Lot of the new part" labelFor="torque-lot" {...err('replacementLot')}>
          <InputGroup id="torque-lot" value={lot} onValueChange={setLot} />
        </FormGroup>
      )}
      <FormGroup label="Date and time" labelFor="torque-when" {...err('performedAt')}>
        <InputGroup id="torque-when" type="datetime-local" value={when} onValueChange={setWhen} />
      </FormGroup>
      {fields['(form)'] && (
        <Callout intent="danger" role="alert" compact>
          {fields['(form)']}
        </Callout>
      )}
      <div className="torque-form__actions">
        <Button type="submit" intent="primary" text="Save torque" loading={log.isPending} />
        <Button variant="minimal" text="Cancel" onClick={onDone} />
      </div>
    </form>
  );
}
