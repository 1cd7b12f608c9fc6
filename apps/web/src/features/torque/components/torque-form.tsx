import { Button, Callout, Checkbox, HTMLSelect, InputGroup } from '@blueprintjs/core';
import { MANUFACTURER_CAUTION, type StackPart, TorqueBody, type TorqueReason } from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE, torqueVerdict } from '@torquetrail/domain';
import { FormProvider, useWatch } from 'react-hook-form';
import { TORQUE_REASON_LABEL, TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';
import { localNow } from '../../../lib/dates';
import {
  applyServerErrors,
  draftSchema,
  errorAt,
  FormField,
  DateField,
  formErrorMessage,
  NumberInput,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useLogTorque } from '../api/log-torque';
import { WrenchCalibrationWarning, WrenchOptions } from './wrench-options';
import { instant } from './local-instant';
import { runMutation } from '../../../lib/run-mutation';
import './torque.css';

interface TorqueDraft {
  componentInstanceId: string;
  appliedNcm: number | null;
  wrenchId: string;
  reason: TorqueReason;
  /** Local date (YYYY-MM-DD from the app's date field) and time (HH:MM) as entered. */
  performedOn: string;
  performedTime: string;
  replacementLot: string;
  /** Shown once the API warns that a settling re-torque comes early. */
  confirmEarlySettling: boolean;
}

const schema = draftSchema(TorqueBody, (d: TorqueDraft) => ({
  componentInstanceId: d.componentInstanceId,
  appliedNcm: d.appliedNcm ?? Number.NaN,
  wrenchId: d.wrenchId || null,
  reason: d.reason,
  performedAt: instant(`${d.performedOn}T${d.performedTime}`),
  replacementLot: d.reason === 'screw-replaced' ? d.replacementLot || null : null,
  confirmEarlySettling: d.confirmEarlySettling,
}));

/**
 * Torque entry: which part, the applied value, the wrench, the reason and when. The spec and the
 * verdict (torqueVerdict from @torquetrail/domain, as on the server) show beside the value.
 */
export function TorqueForm({ siteId, parts, onDone }: { siteId: string; parts: StackPart[]; onDone: () => void }) {
  const torqueable = parts.filter((p) => p.torqueSpecNcm !== null);
  const form = useContractForm(schema, {
    componentInstanceId: torqueable[0]?.instanceId ?? '',
    appliedNcm: null,
    wrenchId: '',
    reason: 'initial-seating',
    performedOn: localNow().slice(0, 10),
    performedTime: localNow().slice(11, 16),
    replacementLot: '',
    confirmEarlySettling: false,
  });
  const [instanceId, applied, reason, wrenchId, confirming] = useWatch({
    control: form.control,
    name: ['componentInstanceId', 'appliedNcm', 'reason', 'wrenchId', 'confirmEarlySettling'],
  });
  // The API's warning that a settling re-torque comes early: the clinician may confirm and save.
  const earlyWarning = errorAt(form.formState.errors, 'confirmEarlySettling');
  const log = useLogTorque(siteId);
  const part = torqueable.find((p) => p.instanceId === instanceId);

  if (torqueable.length === 0)
    return (
      <Callout intent="primary">
        No part of this site has a torque specification (healing abutments and cover screws are hand-tight).
      </Callout>
    );

  const inRange = applied !== null && applied >= TORQUE_NCM_RANGE.min && applied <= TORQUE_NCM_RANGE.max;
  const verdict =
    part && inRange
      ? torqueVerdict({ appliedNcm: applied, specNcm: part.torqueSpecNcm!, tolerancePct: part.tolerancePct })
      : null;

  const submit = (body: TorqueBody) =>
    runMutation(log, body, { onSuccess: onDone, onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');

  return (
    <FormProvider {...form}>
      <form
        className="torque-form"
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
        aria-label="Log torque"
        data-testid="torque-form"
        noValidate
      >
        <Callout intent="warning" icon="info-sign" compact>
          {MANUFACTURER_CAUTION}
        </Callout>
        <FormField name="componentInstanceId" label="Part" labelFor="torque-part">
          <HTMLSelect id="torque-part" fill {...form.register('componentInstanceId')}>
            {torqueable.map((p) => (
              <option key={p.instanceId} value={p.instanceId}>
                {p.name} ({p.referenceCode})
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        <FormField name="appliedNcm" label="Applied torque (N·cm)" labelFor="torque-applied">
          <NumberInput
            name="appliedNcm"
            buttonPosition="none"
            id="torque-applied"
            min={TORQUE_NCM_RANGE.min}
            max={TORQUE_NCM_RANGE.max}
            stepSize={0.5}
            minorStepSize={0.1}
            fill
            allowNumericCharactersOnly
          />
        </FormField>
        {part && (
          <p className="torque-form__spec" data-testid="torque-spec">
            Specification {part.torqueSpecNcm} N·cm ± {part.tolerancePct} %
            {verdict && (
              <>
                {' '}
                · <strong data-testid="torque-live-verdict">{TORQUE_VERDICT_LABEL[verdict]}</strong>
              </>
            )}
          </p>
        )}
        <FormField name="wrenchId" label="Wrench" labelFor="torque-wrench">
          <HTMLSelect id="torque-wrench" fill {...form.register('wrenchId')}>
            <WrenchOptions />
          </HTMLSelect>
        </FormField>
        <WrenchCalibrationWarning wrenchId={wrenchId} />
        <FormField name="reason" label="Reason" labelFor="torque-reason">
          <HTMLSelect id="torque-reason" fill {...form.register('reason')}>
            {Object.entries(TORQUE_REASON_LABEL).map(([value, text]) => (
              <option key={value} value={value}>
                {text}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        {reason === 'screw-replaced' && (
          <FormField name="replacementLot" label="Lot of the new part" labelFor="torque-lot">
            <InputGroup id="torque-lot" {...withInputRef(form.register('replacementLot'))} />
          </FormField>
        )}
        <FormField name="performedAt" label="Date and time" labelFor="torque-when">
          {/* The date in the practice's format (lib/dates.ts); the time of day beside it. */}
          <div className="torque-when">
            <DateField id="torque-when" name="performedOn" aria-label="Date" />
            <InputGroup type="time" aria-label="Time" {...withInputRef(form.register('performedTime'))} />
          </div>
        </FormField>
        {(earlyWarning || confirming) && reason === 're-torque-after-settling' && (
          <Callout intent="warning" icon="time" compact data-testid="early-settling-warning">
            {earlyWarning && <p>{earlyWarning}.</p>}
            <Checkbox
              label="I confirm this early re-torque after settling (the confirmation is saved with the entry)"
              {...withInputRef(form.register('confirmEarlySettling'))}
            />
          </Callout>
        )}
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
        <div className="torque-form__actions">
          <Button type="submit" intent="primary" text="Save torque" loading={log.isPending} />
          <Button variant="minimal" text="Cancel" onClick={onDone} />
        </div>
      </form>
    </FormProvider>
  );
}
