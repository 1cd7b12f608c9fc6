import { Button, Callout, HTMLSelect, HTMLTable, InputGroup } from '@blueprintjs/core';
import { MANUFACTURER_CAUTION, type RestorationScrew, SeatRestorationBody } from '@torquetrail/contracts';
import { formatTooth, TORQUE_NCM_RANGE, torqueVerdict } from '@torquetrail/domain';
import { FormProvider, useWatch } from 'react-hook-form';
import { formatTorqueSpec, TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDateTime, localNow } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  FieldError,
  FormField,
  formErrorMessage,
  NumberInput,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useToothSystem } from '../../../lib/tooth-system';
import { useRestorationScrews, useSeatRestoration } from '../api/seat-restoration';
import { WrenchCalibrationWarning, WrenchOptions } from './wrench-options';
import { instant } from './local-instant';
import { runMutation } from '../../../lib/run-mutation';
import './torque.css';

interface SeatDraft {
  wrenchId: string;
  /** Local date (YYYY-MM-DD from the app's date field) and time (HH:MM) as entered. */
  performedOn: string;
  performedTime: string;
  screws: { componentInstanceId: string; appliedNcm: number | null }[];
}

const schema = draftSchema(SeatRestorationBody, (d: SeatDraft) => ({
  wrenchId: d.wrenchId || null,
  performedAt: instant(`${d.performedOn}T${d.performedTime}`),
  screws: d.screws.map((s) => ({ componentInstanceId: s.componentInstanceId, appliedNcm: s.appliedNcm ?? Number.NaN })),
}));

const liveVerdict = (screw: RestorationScrew, applied: number | null | undefined) =>
  applied != null && applied >= TORQUE_NCM_RANGE.min && applied <= TORQUE_NCM_RANGE.max
    ? torqueVerdict({ appliedNcm: applied, specNcm: screw.torqueSpecNcm, tolerancePct: screw.tolerancePct })
    : null;

/**
 * Seat restoration: every screw of a delivered restoration in one form — the spec beside each, the
 * applied value, one wrench and one time for all, the verdict of each screw live (torqueVerdict, as
 * on the server) — saved in one transaction.
 */
export function SeatRestorationForm({ restorationId, onDone }: { restorationId: string; onDone: () => void }) {
  const screws = useRestorationScrews(restorationId);
  if (screws.isPending) return <LoadingState label="Loading the screws of this restoration" />;
  if (screws.isError)
    return <ErrorState title="Could not load the screws" error={screws.error} onRetry={() => void screws.refetch()} />;
  if (screws.data.items.length === 0)
    return (
      <Callout intent="primary" data-testid="seat-no-screws">
        No part of this restoration has a torque specification (hand-tight parts need no seating torque).
      </Callout>
    );
  return <SeatForm restorationId={restorationId} screws={screws.data.items} onDone={onDone} />;
}

function SeatForm({
  restorationId,
  screws,
  onDone,
}: {
  restorationId: string;
  screws: RestorationScrew[];
  onDone: () => void;
}) {
  const [system] = useToothSystem();
  const form = useContractForm(schema, {
    wrenchId: '',
    performedOn: localNow().slice(0, 10),
    performedTime: localNow().slice(11, 16),
    screws: screws.map((s) => ({ componentInstanceId: s.instanceId, appliedNcm: null })),
  });
  const [applied, wrenchId] = useWatch({ control: form.control, name: ['screws', 'wrenchId'] });
  const seat = useSeatRestoration(restorationId);
  const submit = (body: SeatRestorationBody) =>
    runMutation(seat, body, { onSuccess: onDone, onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');

  return (
    <FormProvider {...form}>
      <form
        className="torque-form seat-form"
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
        aria-label="Seat restoration"
        data-testid="seat-form"
        noValidate
      >
        <h3 className="seat-form__title">Seat restoration: initial seating torque of every screw</h3>
        <Callout intent="warning" icon="info-sign" compact>
          {MANUFACTURER_CAUTION}
        </Callout>
        <HTMLTable compact className="seat-form__table">
          <thead>
            <tr>
              <th>Site</th>
              <th>Part</th>
              <th>Specification</th>
              <th>Applied (N·cm)</th>
              <th>Verdict</th>
            </tr>
          </thead>
          <tbody>
            {screws.map((screw, i) => {
              const verdict = liveVerdict(screw, applied[i]?.appliedNcm);
              return (
                <tr key={screw.instanceId} data-testid="seat-screw">
                  <td className="seat-form__nowrap">{formatTooth(screw.fdi, system)}</td>
                  <td>
                    {screw.name}
                    {screw.seatedAt && <div className="muted">Seated before on {formatDateTime(screw.seatedAt)}</div>}
                  </td>
                  <td className="seat-form__nowrap" data-testid="seat-spec">
                    {formatTorqueSpec(screw.torqueSpecNcm, screw.tolerancePct)}
                  </td>
                  <td>
                    <NumberInput
                      name={`screws.${i}.appliedNcm`}
                      aria-label={`Applied torque at ${formatTooth(screw.fdi, system)}, ${screw.name}`}
                      buttonPosition="none"
                      min={TORQUE_NCM_RANGE.min}
                      max={TORQUE_NCM_RANGE.max}
                      stepSize={0.5}
                      minorStepSize={0.1}
                      allowNumericCharactersOnly
                    />
                    <FieldError name={`screws.${i}.appliedNcm`} />
                  </td>
                  <td data-testid="seat-verdict">{verdict ? <strong>{TORQUE_VERDICT_LABEL[verdict]}</strong> : '—'}</td>
                </tr>
              );
            })}
          </tbody>
        </HTMLTable>
        <FormField name="wrenchId" label="Wrench (for every screw)" labelFor="seat-wrench">
          <HTMLSelect id="seat-wrench" fill {...form.register('wrenchId')}>
            <WrenchOptions />
          </HTMLSelect>
        </FormField>
        <WrenchCalibrationWarning wrenchId={wrenchId} />
        <FormField name="performedAt" label="Date and time (for every screw)" labelFor="seat-when">
          {/* The date in the practice's format (lib/dates.ts); the time of day beside it. */}
          <div className="torque-when">
            <DateField id="seat-when" name="performedOn" aria-label="Date" />
            <InputGroup type="time" aria-label="Time" {...withInputRef(form.register('performedTime'))} />
          </div>
        </FormField>
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
        <div className="torque-form__actions">
          <Button type="submit" intent="primary" text="Save seating torques" loading={seat.isPending} />
          <Button variant="minimal" text="Later" onClick={onDone} />
        </div>
      </form>
    </FormProvider>
  );
}
