import { Button, Checkbox, HTMLSelect, InputGroup } from '@blueprintjs/core';
import {
  COLLAR_HEIGHT_MM_RANGE,
  COMPONENT_KINDS,
  type ComponentKind,
  ComponentBody,
  type Connection,
  CONNECTIONS,
  PART_ANGLE_DEG_RANGE,
  PLATFORM_DIAMETER_MM_RANGE,
  PlatformBody,
  SystemBody,
  TOLERANCE_PCT_RANGE,
  type Tray,
  TRAYS,
  WrenchBody,
  type WrenchType,
  WRENCH_TYPES,
} from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { type ReactNode, useId, useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import {
  COMPONENT_KIND_LABEL,
  CONNECTION_LABEL,
  INTERFACE_LABEL,
  TRAY_LABEL,
  WRENCH_TYPE_LABEL,
} from '../../../lib/clinical-labels';
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

function Toggle({ label, children }: { label: string; children: (close: () => void) => ReactNode }) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  return open ? (
    <div className="catalogue-add">{children(() => setOpen(false))}</div>
  ) : (
    <Button small icon="add" text={label} onClick={() => setOpen(true)} />
  );
}

interface ComponentDraft {
  kind: ComponentKind;
  name: string;
  referenceCode: string;
  engaging: '' | 'yes' | 'no';
  torqueSpecNcm: number | null;
  tolerancePct: number | null;
  requiresLot: boolean;
  angleDeg: number | null;
  collarHeightMm: number | null;
  tray: '' | Tray;
}

/** Admin: a new part on one platform, with its torque specification and the tolerance the practice uses. */
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
        engaging: d.engaging === '' ? null : d.engaging === 'yes',
        torqueSpecNcm: d.torqueSpecNcm,
        // An emptied tolerance is no number: the contract says so beside the field.
        tolerancePct: d.tolerancePct ?? Number.NaN,
        requiresLot: d.requiresLot,
        angleDeg: d.angleDeg,
        collarHeightMm: d.collarHeightMm,
        tray: d.tray || null,
      })),
    [platformId],
  );
  const form = useContractForm(schema, {
    kind: 'abutment-screw',
    name: '',
    referenceCode: '',
    engaging: '',
    torqueSpecNcm: null,
    tolerancePct: 10,
    requiresLot: true,
    angleDeg: null,
    collarHeightMm: null,
    tray: '',
  });
  return (
    <FormProvider {...form}>
      <Toggle label="Add part">
        {(close) => (
          <form
            aria-label="Add part"
            onSubmit={(event) =>
              void form.handleSubmit((body) =>
                runMutation(
                  save,
                  { body },
                  { onSuccess: close, onError: (error) => applyServerErrors(form.setError, error) },
                ),
              )(event)
            }
          >
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
            <FormField name="engaging" label="Engaging" labelFor={`${uid}-engaging`} inline>
              <HTMLSelect id={`${uid}-engaging`} {...form.register('engaging')}>
                <option value="">does not apply</option>
                <option value="yes">{INTERFACE_LABEL.engaging.toLowerCase()}</option>
                <option value="no">{INTERFACE_LABEL['non-engaging'].toLowerCase()}</option>
              </HTMLSelect>
            </FormField>
            <FormField
              name="torqueSpecNcm"
              label="Torque (N·cm, empty = hand-tight)"
              labelFor={`${uid}-torque-n-cm-empty-hand-tight`}
              inline
            >
              <NumberInput
                name="torqueSpecNcm"
                buttonPosition="none"
                id={`${uid}-torque-n-cm-empty-hand-tight`}
                min={TORQUE_NCM_RANGE.min}
                max={TORQUE_NCM_RANGE.max}
              />
            </FormField>
            <FormField name="tolerancePct" label="Tolerance (%)" labelFor={`${uid}-tolerance`} inline>
              <NumberInput
                name="tolerancePct"
                buttonPosition="none"
                id={`${uid}-tolerance`}
                min={TOLERANCE_PCT_RANGE.min}
                max={TOLERANCE_PCT_RANGE.max}
              />
            </FormField>
            <FormField name="angleDeg" label="Angle (°)" labelFor={`${uid}-angle`} inline>
              <NumberInput
                name="angleDeg"
                buttonPosition="none"
                id={`${uid}-angle`}
                min={PART_ANGLE_DEG_RANGE.min}
                max={PART_ANGLE_DEG_RANGE.max}
              />
            </FormField>
            <FormField name="collarHeightMm" label="Collar height (mm)" labelFor={`${uid}-collar`} inline>
              <NumberInput
                name="collarHeightMm"
                buttonPosition="none"
                id={`${uid}-collar`}
                min={COLLAR_HEIGHT_MM_RANGE.min}
                max={COLLAR_HEIGHT_MM_RANGE.max}
                stepSize={0.5}
              />
            </FormField>
            <FormField name="tray" label="Impression tray" labelFor={`${uid}-tray`} inline>
              <HTMLSelect id={`${uid}-tray`} {...form.register('tray')}>
                <option value="">does not apply</option>
                {TRAYS.map((t) => (
                  <option key={t} value={t}>
                    {TRAY_LABEL[t].toLowerCase()}
                  </option>
                ))}
              </HTMLSelect>
            </FormField>
            <Checkbox label="Lot number required when delivered" {...withInputRef(form.register('requiresLot'))} />
            <Button type="submit" intent="primary" small text="Add part" loading={save.isPending} />{' '}
            <Button small variant="minimal" text="Cancel" onClick={close} />
          </form>
        )}
      </Toggle>
    </FormProvider>
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
    <FormProvider {...form}>
      <Toggle label="Add platform">
        {(close) => (
          <form
            aria-label="Add platform"
            onSubmit={(event) =>
              void form.handleSubmit((body) =>
                runMutation(add, body, {
                  onSuccess: close,
                  onError: (error) => applyServerErrors(form.setError, error),
                }),
              )(event)
            }
          >
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
            <Button type="submit" intent="primary" small text="Add platform" loading={add.isPending} />{' '}
            <Button small variant="minimal" text="Cancel" onClick={close} />
          </form>
        )}
      </Toggle>
    </FormProvider>
  );
}

export function AddSystemForm() {
  const uid = useId();
  const add = useAddSystem();
  const form = useContractForm(SystemBody, { name: '', manufacturer: '' });
  return (
    <FormProvider {...form}>
      <Toggle label="Add implant system">
        {(close) => (
          <form
            aria-label="Add implant system"
            onSubmit={(event) =>
              void form.handleSubmit((body) =>
                runMutation(add, body, {
                  onSuccess: close,
                  onError: (error) => applyServerErrors(form.setError, error),
                }),
              )(event)
            }
          >
            <FormField name="name" label="Name" labelFor={`${uid}-name`} inline>
              <InputGroup id={`${uid}-name`} {...withInputRef(form.register('name'))} />
            </FormField>
            <FormField name="manufacturer" label="Manufacturer" labelFor={`${uid}-manufacturer`} inline>
              <InputGroup id={`${uid}-manufacturer`} {...withInputRef(form.register('manufacturer'))} />
            </FormField>
            <Button type="submit" intent="primary" small text="Add system" loading={add.isPending} />{' '}
            <Button small variant="minimal" text="Cancel" onClick={close} />
          </form>
        )}
      </Toggle>
    </FormProvider>
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
    <FormProvider {...form}>
      <Toggle label="Add wrench">
        {(close) => (
          <form
            aria-label="Add wrench"
            onSubmit={(event) =>
              void form.handleSubmit((body) =>
                runMutation(
                  save,
                  { body },
                  { onSuccess: close, onError: (error) => applyServerErrors(form.setError, error) },
                ),
              )(event)
            }
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
            <Button type="submit" intent="primary" small text="Add wrench" loading={save.isPending} />{' '}
            <Button small variant="minimal" text="Cancel" onClick={close} />
          </form>
        )}
      </Toggle>
    </FormProvider>
  );
}
