import { Button, Checkbox, HTMLSelect, InputGroup } from '@blueprintjs/core';
import {
  COMPONENT_KINDS,
  type ComponentKind,
  ComponentBody,
  type Connection,
  CONNECTIONS,
  PLATFORM_DIAMETER_MM_RANGE,
  PlatformBody,
  SystemBody,
  WrenchBody,
  type WrenchType,
  WRENCH_TYPES,
} from '@torquetrail/contracts';
import { type ReactNode, useId, useMemo, useState } from 'react';
import { type FieldValues, FormProvider, type UseFormReturn } from 'react-hook-form';
import type { UseMutationResult } from '@tanstack/react-query';
import { COMPONENT_KIND_LABEL, CONNECTION_LABEL, WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  FormField,
  NumberInput,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useSaveWrench } from '../../torque';
import { useAddPlatform, useAddSystem, useSaveComponent } from '../api/catalogue-api';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';
import { EMPTY_PART_VALUES, PartValueFields, partValuesBody, type PartValuesDraft } from './part-value-fields';

/**
 * What every add form here shares: a button that opens the form, the fields, Add and Cancel; the
 * API's field errors land beside their fields and a saved form closes.
 */
function AddToggleForm<Values extends FieldValues, Body, Variables>({
  label,
  submitText,
  form,
  mutation,
  variables,
  children,
}: {
  /** The opening button's text and the form's accessible name. */
  label: string;
  submitText: string;
  form: UseFormReturn<Values, unknown, Body>;
  mutation: UseMutationResult<unknown, Error, Variables>;
  variables: (body: Body) => Variables;
  children: ReactNode;
}) {
  const [open, setOpen] = useState(false);
  const close = () => setOpen(false);
  useCloseOnEscape(open, close);
  if (!open) return <Button small icon="add" text={label} onClick={() => setOpen(true)} />;
  return (
    <FormProvider {...form}>
      <div className="catalogue-add">
        <form
          aria-label={label}
          onSubmit={(event) =>
            void form.handleSubmit((body) =>
              runMutation(mutation, variables(body), {
                onSuccess: close,
                onError: (error) => applyServerErrors(form.setError, error),
              }),
            )(event)
          }
        >
          {children}
          <Button type="submit" intent="primary" small text={submitText} loading={mutation.isPending} />{' '}
          <Button small variant="minimal" text="Cancel" onClick={close} />
        </form>
      </div>
    </FormProvider>
  );
}

interface ComponentDraft extends PartValuesDraft {
  kind: ComponentKind;
  name: string;
  referenceCode: string;
  requiresLot: boolean;
}

/**
 * Admin: a new part on one platform. The inputs follow the kind chosen: the values the plan's rules
 * and the lab read for that kind (PartValueFields, shared with the row's edit), its torque
 * specification and the tolerance the practice uses.
 */
export function AddComponentForm({ platformId }: { platformId: string }) {
  const uid = useId();
  const save = useSaveComponent();
  const schema = useMemo(
    () =>
      draftSchema(ComponentBody, (d: ComponentDraft) => ({
        platformId,
        kind: d.kind,
        name: d.name,
        referenceCode: d.referenceCode,
        requiresLot: d.requiresLot,
        ...partValuesBody(d, d.kind),
      })),
    [platformId],
  );
  const form = useContractForm(schema, {
    kind: 'abutment-screw',
    name: '',
    referenceCode: '',
    requiresLot: true,
    ...EMPTY_PART_VALUES,
  });
  const kind = form.watch('kind') as ComponentKind;
  return (
    <AddToggleForm label="Add part" submitText="Add part" form={form} mutation={save} variables={(body) => ({ body })}>
      <FormField name="kind" label="Kind" labelFor={`${uid}-kind`} inline>
        <HTMLSelect id={`${uid}-kind`} {...form.register('kind')}>
          {COMPONENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {COMPONENT_KIND_LABEL[k]}
            </option>
          ))}
        </HTMLSelect>
      </FormField>
      <FormField name="name" label="Name" labelFor={`${uid}-name`} inline>
        <InputGroup id={`${uid}-name`} {...withInputRef(form.register('name'))} />
      </FormField>
      <FormField name="referenceCode" label="Reference" labelFor={`${uid}-reference`} inline>
        <InputGroup id={`${uid}-reference`} {...withInputRef(form.register('referenceCode'))} />
      </FormField>
      <PartValueFields kind={kind} idPrefix={uid} />
      <Checkbox label="Lot number required when delivered" {...withInputRef(form.register('requiresLot'))} />
    </AddToggleForm>
  );
}

interface PlatformDraft {
  name: string;
  diameterMm: number | null;
  connection: Connection;
  platformShift: boolean;
}

export function AddPlatformForm({ systemId }: { systemId: string }) {
  const uid = useId();
  const add = useAddPlatform();
  const schema = useMemo(
    () =>
      draftSchema(PlatformBody, (d: PlatformDraft) => ({
        systemId,
        name: d.name,
        diameterMm: d.diameterMm ?? Number.NaN,
        connection: d.connection,
        platformShift: d.platformShift,
      })),
    [systemId],
  );
  const form = useContractForm(schema, {
    name: '',
    diameterMm: null,
    connection: 'internal-conical',
    platformShift: false,
  });
  return (
    <AddToggleForm label="Add platform" submitText="Add platform" form={form} mutation={add} variables={(body) => body}>
      <FormField name="name" label="Name" labelFor={`${uid}-name`} inline>
        <InputGroup id={`${uid}-name`} {...withInputRef(form.register('name'))} />
      </FormField>
      <FormField name="diameterMm" label="Diameter (mm)" labelFor={`${uid}-diameter-mm`} inline>
        <NumberInput
          name="diameterMm"
          buttonPosition="none"
          id={`${uid}-diameter-mm`}
          min={PLATFORM_DIAMETER_MM_RANGE.min}
          max={PLATFORM_DIAMETER_MM_RANGE.max}
          stepSize={0.1}
        />
      </FormField>
      <FormField name="connection" label="Connection" labelFor={`${uid}-connection`} inline>
        <HTMLSelect id={`${uid}-connection`} {...form.register('connection')}>
          {CONNECTIONS.map((c) => (
            <option key={c} value={c}>
              {CONNECTION_LABEL[c]}
            </option>
          ))}
        </HTMLSelect>
      </FormField>
      <Checkbox label="Platform shift" {...withInputRef(form.register('platformShift'))} />
    </AddToggleForm>
  );
}

export function AddSystemForm() {
  const uid = useId();
  const add = useAddSystem();
  const form = useContractForm(SystemBody, { name: '', manufacturer: '' });
  return (
    <AddToggleForm
      label="Add implant system"
      submitText="Add system"
      form={form}
      mutation={add}
      variables={(body) => body}
    >
      <FormField name="name" label="Name" labelFor={`${uid}-name`} inline>
        <InputGroup id={`${uid}-name`} {...withInputRef(form.register('name'))} />
      </FormField>
      <FormField name="manufacturer" label="Manufacturer" labelFor={`${uid}-manufacturer`} inline>
        <InputGroup id={`${uid}-manufacturer`} {...withInputRef(form.register('manufacturer'))} />
      </FormField>
    </AddToggleForm>
  );
}

interface WrenchDraft {
  label: string;
  type: WrenchType;
  lastCalibratedOn: string;
}

const wrenchSchema = draftSchema(WrenchBody, (d: WrenchDraft) => ({
  label: d.label,
  type: d.type,
  lastCalibratedOn: d.lastCalibratedOn || null,
}));

export function AddWrenchForm() {
  const uid = useId();
  const save = useSaveWrench();
  const form = useContractForm(wrenchSchema, { label: '', type: 'spring', lastCalibratedOn: '' });
  return (
    <AddToggleForm
      label="Add wrench"
      submitText="Add wrench"
      form={form}
      mutation={save}
      variables={(body) => ({ body })}
    >
      <FormField name="label" label="Label" labelFor={`${uid}-label`} inline>
        <InputGroup id={`${uid}-label`} {...withInputRef(form.register('label'))} />
      </FormField>
      <FormField name="type" label="Type" labelFor={`${uid}-type`} inline>
        <HTMLSelect id={`${uid}-type`} {...form.register('type')}>
          {WRENCH_TYPES.map((t) => (
            <option key={t} value={t}>
              {WRENCH_TYPE_LABEL[t].toLowerCase()}
            </option>
          ))}
        </HTMLSelect>
      </FormField>
      <FormField name="lastCalibratedOn" label="Last calibration" labelFor={`${uid}-last-calibration`} inline>
        <DateField id={`${uid}-last-calibration`} name="lastCalibratedOn" />
      </FormField>
    </AddToggleForm>
  );
}
