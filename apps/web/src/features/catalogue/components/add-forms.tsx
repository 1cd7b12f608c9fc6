import { Button, Checkbox, FormGroup, HTMLSelect, InputGroup, NumericInput } from '@blueprintjs/core';
import {
  COLLAR_HEIGHT_MM_RANGE,
  COMPONENT_KINDS,
  type ComponentKind,
  type Connection,
  CONNECTIONS,
  PART_ANGLE_DEG_RANGE,
  PLATFORM_DIAMETER_MM_RANGE,
  TOLERANCE_PCT_RANGE,
  type Tray,
  TRAYS,
  type WrenchType,
  WRENCH_TYPES,
} from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { type FormEvent, type ReactNode, useId, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { useSaveWrench } from '../../torque';
import { useAddPlatform, useAddSystem, useSaveComponent } from '../api/catalogue-api';
import { COMPONENT_KIND_LABEL, CONNECTION_LABEL, INTERFACE_LABEL, TRAY_LABEL, WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';

function Toggle({ label, children }: { label: string; children: (close: () => void) => ReactNode }) {
  const [open, setOpen] = useState(false);
  return open ? <div className="catalogue-add">{children(() => setOpen(false))}</div> : <Button small icon="add" text={label} onClick={() => setOpen(true)} />;
}

const helper = (fields: Record<string, string>, key: string) => (fields[key] ? { intent: 'danger' as const, helperText: fields[key] } : {});
const fieldsOf = (error: unknown) => (isApiError(error) ? error.fields : {});

/** Admin: a new part on one platform, with its torque specification and the tolerance the practice uses. */
export function AddComponentForm({ platformId }: { platformId: string }) {
  const uid = useId();
  const save = useSaveComponent();
  const [kind, setKind] = useState<ComponentKind>('abutment-screw');
  const [name, setName] = useState('');
  const [ref, setRef] = useState('');
  const [engaging, setEngaging] = useState<'' | 'yes' | 'no'>('');
  const [torque, setTorque] = useState<number | null>(null);
  const [tol, setTol] = useState(10);
  const [lot, setLot] = useState(true);
  const [angle, setAngle] = useState<number | null>(null);
  const [collar, setCollar] = useState<number | null>(null);
  const [tray, setTray] = useState<'' | Tray>('');
  const f = fieldsOf(save.error);
  return (
    <Toggle label="Add part">
      {(close) => (
        <form
          aria-label="Add part"
          onSubmit={(e: FormEvent) => {
            e.preventDefault();
            save.mutate({ body: { platformId, kind, name, referenceCode: ref, engaging: engaging === '' ? null : engaging === 'yes', torqueSpecNcm: torque, tolerancePct: tol, requiresLot: lot, angleDeg: angle, collarHeightMm: collar, tray: tray || null } }, { onSuccess: close });
          }}
        >
          <FormGroup label="Kind" labelFor={`${uid}-kind`} inline><HTMLSelect id={`${uid}-kind`} value={kind} onChange={(e) => setKind(e.currentTarget.value as ComponentKind)}>{COMPONENT_KINDS.map((k) => <option key={k} value={k}>{COMPONENT_KIND_LABEL[k]}</option>)}</HTMLSelect></FormGroup>
          <FormGroup label="Name" labelFor={`${uid}-name`} inline {...helper(f, 'name')}><InputGroup id={`${uid}-name`} value={name} onValueChange={setName} /></FormGroup>
          <FormGroup label="Reference" labelFor={`${uid}-reference`} inline {...helper(f, 'referenceCode')}><InputGroup id={`${uid}-reference`} value={ref} onValueChange={setRef} /></FormGroup>
          <FormGroup label="Engaging" labelFor={`${uid}-engaging`} inline><HTMLSelect id={`${uid}-engaging`} value={engaging} onChange={(e) => setEngaging(e.currentTarget.value as '' | 'yes' | 'no')}><option value="">does not apply</option><option value="yes">{INTERFACE_LABEL.engaging.toLowerCase()}</option><option value="no">{INTERFACE_LABEL['non-engaging'].toLowerCase()}</option></HTMLSelect></FormGroup>
          <FormGroup label="Torque (N·cm, empty = hand-tight)" labelFor={`${uid}-torque-n-cm-empty-hand-tight`} inline {...helper(f, 'torqueSpecNcm')}><NumericInput buttonPosition="none" id={`${uid}-torque-n-cm-empty-hand-tight`} min={TORQUE_NCM_RANGE.min} max={TORQUE_NCM_RANGE.max} value={torque ?? ''} onValueChange={(v) => setTorque(Number.isFinite(v) ? v : null)} /></FormGroup>
          <FormGroup label="Tolerance (%)" labelFor={`${uid}-tolerance`} inline {...helper(f, 'tolerancePct')}><NumericInput buttonPosition="none" id={`${uid}-tolerance`} min={TOLERANCE_PCT_RANGE.min} max={TOLERANCE_PCT_RANGE.max} value={tol} onValueChange={setTol} /></FormGroup>
          <FormGroup label="Angle (°)" labelFor={`${uid}-angle`} inline {...helper(f, 'angleDeg')}><NumericInput buttonPosition="none" id={`${uid}-angle`} min={PART_ANGLE_DEG_RANGE.min} max={PART_ANGLE_DEG_RANGE.max} value={angle ?? ''} onValueChange={(v) => setAngle(Number.isFinite(v) ? v : null)} /></FormGroup>
          <FormGroup label="Collar height (mm)" labelFor={`${uid}-collar`} inline {...helper(f, 'collarHeightMm')}><NumericInput buttonPosition="none" id={`${uid}-collar`} min={COLLAR_HEIGHT_MM_RANGE.min} max={COLLAR_HEIGHT_MM_RANGE.max} stepSize={0.5} value={collar ?? ''} onValueChange={(v) => setCollar(Number.isFinite(v) ? v : null)} /></FormGroup>
          <FormGroup label="Impression tray" labelFor={`${uid}-tray`} inline><HTMLSelect id={`${uid}-tray`} value={tray} onChange={(e) => setTray(e.currentTarget.value as '' | Tray)}><option value="">does not apply</option>{TRAYS.map((t) => <option key={t} value={t}>{TRAY_LABEL[t].toLowerCase()}</option>)}</HTMLSelect></FormGroup>
          <Checkbox label="Lot number required when delivered" checked={lot} onChange={(e) => setLot(e.currentTarget.checked)} />
          <Button type="submit" intent="primary" small text="Add part" loading={save.isPending} /> <Button small variant="minimal" text="Cancel" onClick={close} />
        </form>
      )}
    </Toggle>
  );
}

export function AddPlatformForm({ systemId }: { systemId: string }) {
  const uid = useId();
  const add = useAddPlatform();
  const [name, setName] = useState('');
  const [diameter, setDiameter] = useState<number | null>(null);
  const [connection, setConnection] = useState<Connection>('internal-conical');
  const [shift, setShift] = useState(false);
  const f = fieldsOf(add.error);
  return (
    <Toggle label="Add platform">
      {(close) => (
        <form aria-label="Add platform" onSubmit={(e) => { e.preventDefault(); add.mutate({ systemId, name, diameterMm: diameter ?? Number.NaN, connection, platformShift: shift }, { onSuccess: close }); }}>
          <FormGroup label="Name" labelFor={`${uid}-name`} inline {...helper(f, 'name')}><InputGroup id={`${uid}-name`} value={name} onValueChange={setName} /></FormGroup>
          <FormGroup label="Diameter (mm)" labelFor={`${uid}-diameter-mm`} inline {...helper(f, 'diameterMm')}><NumericInput buttonPosition="none" id={`${uid}-diameter-mm`} min={PLATFORM_DIAMETER_MM_RANGE.min} max={PLATFORM_DIAMETER_MM_RANGE.max} stepSize={0.1} value={diameter ?? ''} onValueChange={(v) => setDiameter(Number.isFinite(v) ? v : null)} /></FormGroup>
          <FormGroup label="Connection" labelFor={`${uid}-connection`} inline><HTMLSelect id={`${uid}-connection`} value={connection} onChange={(e) => setConnection(e.currentTarget.value as Connection)}>{CONNECTIONS.map((c) => <option key={c} value={c}>{CONNECTION_LABEL[c]}</option>)}</HTMLSelect></FormGroup>
          <Checkbox label="Platform shift" checked={shift} onChange={(e) => setShift(e.currentTarget.checked)} />
          <Button type="submit" intent="primary" small text="Add platform" loading={add.isPending} /> <Button small variant="minimal" text="Cancel" onClick={close} />
        </form>
      )}
    </Toggle>
  );
}

export function AddSystemForm() {
  const uid = useId();
  const add = useAddSystem();
  const [name, setName] = useState('');
  const [manufacturer, setManufacturer] = useState('');
  const f = fieldsOf(add.error);
  return (
    <Toggle label="Add implant system">
      {(close) => (
        <form aria-label="Add implant system" onSubmit={(e) => { e.preventDefault(); add.mutate({ name, manufacturer }, { onSuccess: close }); }}>
          <FormGroup label="Name" labelFor={`${uid}-name`} inline {...helper(f, 'name')}><InputGroup id={`${uid}-name`} value={name} onValueChange={setName} /></FormGroup>
          <FormGroup label="Manufacturer" labelFor={`${uid}-manufacturer`} inline {...helper(f, 'manufacturer')}><InputGroup id={`${uid}-manufacturer`} value={manufacturer} onValueChange={setManufacturer} /></FormGroup>
          <Button type="submit" intent="primary" small text="Add system" loading={add.isPending} /> <Button small variant="minimal" text="Cancel" onClick={close} />
        </form>
      )}
    </Toggle>
  );
}

export function AddWrenchForm() {
  const uid = useId();
  const save = useSaveWrench();
  const [label, setLabel] = useState('');
  const [type, setType] = useState<WrenchType>('spring');
  const [calibrated, setCalibrated] = useState('');
  const f = fieldsOf(save.error);
  return (
    <Toggle label="Add wrench">
      {(close) => (
        <form aria-label="Add wrench" onSubmit={(e) => { e.preventDefault(); save.mutate({ body: { label, type, lastCalibratedOn: calibrated || null } }, { onSuccess: close }); }}>
          <FormGroup label="Label" labelFor={`${uid}-label`} inline {...helper(f, 'label')}><InputGroup id={`${uid}-label`} value={label} onValueChange={setLabel} /></FormGroup>
          <FormGroup label="Type" labelFor={`${uid}-type`} inline><HTMLSelect id={`${uid}-type`} value={type} onChange={(e) => setType(e.currentTarget.value as WrenchType)}>{WRENCH_TYPES.map((t) => <option key={t} value={t}>{WRENCH_TYPE_LABEL[t].toLowerCase()}</option>)}</HTMLSelect></FormGroup>
          <FormGroup label="Last calibration" labelFor={`${uid}-last-calibration`} inline {...helper(f, 'lastCalibratedOn')}><InputGroup id={`${uid}-last-calibration`} type="date" value={calibrated} onValueChange={setCalibrated} /></FormGroup>
          <Button type="submit" intent="primary" small text="Add wrench" loading={save.isPending} /> <Button small variant="minimal" text="Cancel" onClick={close} />
        </form>
      )}
    </Toggle>
  );
}
