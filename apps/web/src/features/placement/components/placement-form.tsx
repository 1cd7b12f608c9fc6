import { Button, Callout, HTMLSelect, InputGroup, TextArea } from '@blueprintjs/core';
import {
  IMPLANT_LENGTH_MM_RANGE,
  INSERTION_TORQUE_NCM_RANGE,
  ISQ_RANGE,
  type LoadingProtocol,
  PlacementBody,
  type PlacementOptionsReply,
} from '@torquetrail/contracts';
import { checkUdiForPlacement } from '@torquetrail/domain';
import { FormProvider, useWatch } from 'react-hook-form';
import { LOADING_PROTOCOL_LABEL } from '../../../lib/clinical-labels';
import { localToday } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  formErrorMessage,
  FormField,
  NumberInput,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useRecordPlacement } from '../api/record-placement';
import { readUdi, UdiField } from './udi-field';
import { runMutation } from '../../../lib/run-mutation';

interface PlacementDraft {
  platformId: string;
  placedOn: string;
  lengthMm: number | null;
  lot: string;
  udi: string;
  insertionTorqueNcm: number | null;
  stabilityIsq: number | null;
  grafting: string;
  loadingProtocol: LoadingProtocol | '';
  axis: [number | null, number | null, number | null];
  closureComponentId: string;
  closureLot: string;
  notes: string;
}

const schema = draftSchema(PlacementBody, (d: PlacementDraft) => ({
  platformId: d.platformId,
  placedOn: d.placedOn,
  lengthMm: d.lengthMm ?? Number.NaN,
  lot: d.lot || null,
  udi: d.udi || null,
  insertionTorqueNcm: d.insertionTorqueNcm,
  stabilityIsq: d.stabilityIsq,
  grafting: d.grafting || null,
  loadingProtocol: d.loadingProtocol || null,
  axis: d.axis.some((a) => a !== null) ? { x: d.axis[0] ?? 0, y: d.axis[1] ?? 0, z: d.axis[2] ?? 0 } : null,
  closureComponentId: d.closureComponentId || null,
  closureLot: d.closureComponentId ? d.closureLot || null : null,
  notes: d.notes || null,
}));

/**
 * What was placed: platform (from the site's practice catalogue), date, length, lot and UDI,
 * insertion torque, ISQ, grafting, loading, axis, the healing abutment or cover screw, notes.
 * The server checks everything again; its `fields` show beside each field.
 */
export function PlacementForm({
  patientId,
  siteId,
  options,
  onDone,
}: {
  patientId: string;
  siteId: string;
  options: PlacementOptionsReply;
  onDone: () => void;
}) {
  const form = useContractForm(schema, {
    platformId: '',
    placedOn: localToday(),
    lengthMm: null,
    lot: '',
    udi: '',
    insertionTorqueNcm: null,
    stabilityIsq: null,
    grafting: '',
    loadingProtocol: '',
    axis: [null, null, null],
    closureComponentId: '',
    closureLot: '',
    notes: '',
  });
  const [platformId, placedOn, lot, udi, closureId] = useWatch({
    control: form.control,
    name: ['platformId', 'placedOn', 'lot', 'udi', 'closureComponentId'],
  });
  const record = useRecordPlacement(patientId, siteId);

  const platforms = options.systems.flatMap((s) => s.platforms.map((p) => ({ ...p, system: s })));
  const platform = platforms.find((p) => p.id === platformId);
  const closures = platform?.components ?? [];
  // The same check as the server's: a typed lot that differs from the scanned one, shown live.
  const reading = readUdi(udi);
  const lotFinding = reading?.ok
    ? checkUdiForPlacement(reading.udi, { placedOn, lot }).find((f) => f.field === 'lot')
    : undefined;

  const submit = (body: PlacementBody) =>
    runMutation(record, body, { onSuccess: onDone, onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const axisInput = (i: 0 | 1 | 2, label: string) => (
    <NumberInput
      name={`axis.${i}`}
      buttonPosition="none"
      id={`placement-axis-${label}`}
      aria-label={`Axis ${label}`}
      placeholder={label}
      stepSize={0.1}
      minorStepSize={0.01}
      majorStepSize={1}
    />
  );

  return (
    <FormProvider {...form}>
      <form
        className="placement-form"
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
        aria-label="Record placement"
        data-testid="placement-form"
        noValidate
      >
        <Callout intent="warning" icon="info-sign" compact>
          {options.caution}
        </Callout>
        <FormField name="platformId" label="Platform" labelFor="placement-platform">
          <HTMLSelect
            id="placement-platform"
            fill
            {...form.register('platformId', { onChange: () => form.setValue('closureComponentId', '') })}
          >
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
        </FormField>
        <div className="placement-form__row">
          <FormField name="placedOn" label="Placed on" labelFor="placement-date">
            <DateField id="placement-date" name="placedOn" />
          </FormField>
          <FormField name="lengthMm" label="Implant length (mm)" labelFor="placement-length">
            <NumberInput
              name="lengthMm"
              buttonPosition="none"
              id="placement-length"
              min={IMPLANT_LENGTH_MM_RANGE.min}
              max={IMPLANT_LENGTH_MM_RANGE.max}
              stepSize={0.5}
              allowNumericCharactersOnly
            />
          </FormField>
        </div>
        <UdiField />
        <FormField
          name="lot"
          live={lotFinding?.message}
          label="Lot"
          labelFor="placement-lot"
          subLabel="Filled from the UDI when it has one"
        >
          <InputGroup id="placement-lot" className="mono" autoComplete="off" {...withInputRef(form.register('lot'))} />
        </FormField>
        <div className="placement-form__row">
          <FormField name="insertionTorqueNcm" label="Insertion torque (N·cm)" labelFor="placement-torque">
            <NumberInput
              name="insertionTorqueNcm"
              buttonPosition="none"
              id="placement-torque"
              min={INSERTION_TORQUE_NCM_RANGE.min}
              max={INSERTION_TORQUE_NCM_RANGE.max}
              allowNumericCharactersOnly
            />
          </FormField>
          <FormField name="stabilityIsq" label="Stability (ISQ)" labelFor="placement-isq">
            <NumberInput
              name="stabilityIsq"
              buttonPosition="none"
              id="placement-isq"
              min={ISQ_RANGE.min}
              max={ISQ_RANGE.max}
              allowNumericCharactersOnly
            />
          </FormField>
          <FormField name="loadingProtocol" label="Loading protocol" labelFor="placement-loading">
            <HTMLSelect id="placement-loading" {...form.register('loadingProtocol')}>
              <option value="">Not recorded</option>
              {Object.entries(LOADING_PROTOCOL_LABEL).map(([value, text]) => (
                <option key={value} value={value}>
                  {text}
                </option>
              ))}
            </HTMLSelect>
          </FormField>
        </div>
        <FormField name="grafting" label="Grafting" labelFor="placement-grafting">
          <InputGroup
            id="placement-grafting"
            placeholder="e.g. none, xenograft buccal contour, sinus lift"
            {...withInputRef(form.register('grafting'))}
          />
        </FormField>
        {/* The contract checks the vector (not zero) and each component (±1000): both show here. */}
        <FormField
          name={['axis', 'axis.x', 'axis.y', 'axis.z']}
          label="Implant axis (optional direction vector x, y, z)"
          labelFor="placement-axis-x"
        >
          <div className="placement-form__axis">
            {axisInput(0, 'x')}
            {axisInput(1, 'y')}
            {axisInput(2, 'z')}
          </div>
        </FormField>
        <div className="placement-form__row">
          <FormField
            name="closureComponentId"
            label="Healing abutment or cover screw"
            labelFor="placement-closure"
            subLabel="Hand-tight: no torque is logged"
          >
            <HTMLSelect id="placement-closure" disabled={!platform} {...form.register('closureComponentId')}>
              <option value="">None</option>
              {closures.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name} [{c.referenceCode}]
                </option>
              ))}
            </HTMLSelect>
          </FormField>
          {closureId && (
            <FormField name="closureLot" label="Lot of that part" labelFor="placement-closure-lot">
              <InputGroup
                id="placement-closure-lot"
                className="mono"
                autoComplete="off"
                {...withInputRef(form.register('closureLot'))}
              />
            </FormField>
          )}
        </div>
        <FormField name="notes" label="Notes" labelFor="placement-notes">
          <TextArea id="placement-notes" fill {...withInputRef(form.register('notes'))} />
        </FormField>
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
        <div className="placement-form__actions">
          <Button
            type="submit"
            intent="primary"
            text="Save placement"
            loading={record.isPending}
            data-testid="save-placement"
          />
          <Button variant="minimal" text="Cancel" onClick={onDone} />
        </div>
      </form>
    </FormProvider>
  );
}
