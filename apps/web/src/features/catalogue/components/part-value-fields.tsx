import { Callout, HTMLSelect, InputGroup } from '@blueprintjs/core';
import {
  type CatalogueComponent,
  COLLAR_HEIGHT_MM_RANGE,
  type ComponentKind,
  COPING_LEVELS,
  type CopingLevel,
  kindStates,
  type KindValue,
  MANUFACTURER_CAUTION,
  MAX_DIVERGENCE_DEG_RANGE,
  PART_ANGLE_DEG_RANGE,
  RETENTION_N_RANGE,
  TOLERANCE_PCT_RANGE,
  type Tray,
  TRAYS,
} from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { useFormContext } from 'react-hook-form';
import { COPING_LEVEL_LABEL, INTERFACE_LABEL, TRAY_LABEL } from '../../../lib/clinical-labels';
import { FormField, NumberInput, withInputRef } from '../../../lib/forms';

/**
 * The values of a part as its forms hold them (text as typed, '' for "not stated"): one field set
 * for adding a part and for editing one, so each value is entered one way.
 */
export interface PartValuesDraft {
  engaging: '' | 'yes' | 'no';
  angleDeg: number | null;
  collarHeightMm: number | null;
  maxDivergenceDeg: number | null;
  retentionLabel: string;
  retentionN: number | null;
  copingLevel: '' | CopingLevel;
  tray: '' | Tray;
  torqueSpecNcm: number | null;
  tolerancePct: number | null;
}

export const EMPTY_PART_VALUES: PartValuesDraft = {
  engaging: '',
  angleDeg: null,
  collarHeightMm: null,
  maxDivergenceDeg: null,
  retentionLabel: '',
  retentionN: null,
  copingLevel: '',
  tray: '',
  torqueSpecNcm: null,
  tolerancePct: 10,
};

/** A saved part's values as the form's draft. */
export function partValuesDraft(part: CatalogueComponent): PartValuesDraft {
  return {
    engaging: part.engaging === null ? '' : part.engaging ? 'yes' : 'no',
    angleDeg: part.angleDeg,
    collarHeightMm: part.collarHeightMm,
    maxDivergenceDeg: part.maxDivergenceDeg,
    retentionLabel: part.retentionLabel ?? '',
    retentionN: part.retentionN,
    copingLevel: part.copingLevel ?? '',
    tray: part.tray ?? '',
    torqueSpecNcm: part.torqueSpecNcm,
    tolerancePct: part.tolerancePct,
  };
}

/**
 * The draft as the contract's values. A value this kind of part does not state is null (adding)
 * or left out (editing: `omitOthers`), so a hidden input never sends anything.
 */
export function partValuesBody(d: PartValuesDraft, kind: ComponentKind, omitOthers = false) {
  const values = {
    engaging: d.engaging === '' ? null : d.engaging === 'yes',
    angleDeg: d.angleDeg,
    collarHeightMm: d.collarHeightMm,
    maxDivergenceDeg: d.maxDivergenceDeg,
    retentionLabel: d.retentionLabel.trim() || null,
    retentionN: d.retentionN,
    copingLevel: d.copingLevel || null,
    tray: d.tray || null,
  };
  const kept = Object.fromEntries(
    Object.entries(values).flatMap(([k, v]) =>
      kindStates(kind, k as KindValue) ? [[k, v]] : omitOthers ? [] : [[k, null]],
    ),
  );
  return {
    ...kept,
    torqueSpecNcm: d.torqueSpecNcm,
    // An emptied tolerance is no number: the contract says so beside the field.
    tolerancePct: d.tolerancePct ?? Number.NaN,
  };
}

/**
 * The inputs for the values a part of this kind states, each with its error beside it, and the
 * manufacturer's caution over them: the manufacturer's instructions rule every value entered here.
 * `subject` names the part in each label when several forms are on the page (a row being edited).
 */
export function PartValueFields({
  kind,
  idPrefix,
  subject,
}: {
  kind: ComponentKind;
  idPrefix: string;
  subject?: string;
}) {
  const { register } = useFormContext<PartValuesDraft>();
  const of = subject ? ` of ${subject}` : '';
  const id = (name: string) => `${idPrefix}-${name}`;
  const states = (value: KindValue) => kindStates(kind, value);
  return (
    <div className="part-value-fields" data-testid="part-value-fields">
      <Callout compact intent="warning" icon="warning-sign" data-testid="part-values-caution">
        {MANUFACTURER_CAUTION} Enter the values the manufacturer states for this part.
      </Callout>
      {states('engaging') && (
        <FormField name="engaging" label={`Engaging${of}`} labelFor={id('engaging')} inline>
          <HTMLSelect id={id('engaging')} {...register('engaging')}>
            <option value="">not stated</option>
            <option value="yes">{INTERFACE_LABEL.engaging.toLowerCase()} (anti-rotational)</option>
            <option value="no">{INTERFACE_LABEL['non-engaging'].toLowerCase()}</option>
          </HTMLSelect>
        </FormField>
      )}
      {states('copingLevel') && (
        <ChoiceField
          name="copingLevel"
          label={`Coping level${of}`}
          id={id('coping-level')}
          none="not stated"
          choices={COPING_LEVELS}
          words={COPING_LEVEL_LABEL}
        />
      )}
      {states('angleDeg') && (
        <NumberField
          name="angleDeg"
          label={`Angle${of} (°, ${UNSTATED})`}
          id={id('angle')}
          range={PART_ANGLE_DEG_RANGE}
        />
      )}
      {states('collarHeightMm') && (
        <NumberField
          name="collarHeightMm"
          label={`Collar height${of} (mm, ${UNSTATED})`}
          id={id('collar')}
          range={COLLAR_HEIGHT_MM_RANGE}
          stepSize={0.5}
        />
      )}
      {states('maxDivergenceDeg') && (
        <NumberField
          name="maxDivergenceDeg"
          label={`Divergence tolerance between implants${of} (°, ${UNSTATED})`}
          id={id('divergence')}
          range={MAX_DIVERGENCE_DEG_RANGE}
        />
      )}
      {states('retentionLabel') && (
        <FormField
          name="retentionLabel"
          label={`Retention strength${of} (as labelled, e.g. light)`}
          labelFor={id('retention-label')}
          inline
        >
          <InputGroup id={id('retention-label')} {...withInputRef(register('retentionLabel'))} />
        </FormField>
      )}
      {states('retentionN') && (
        <NumberField
          name="retentionN"
          label={`Retention force${of} (N, ${UNSTATED})`}
          id={id('retention-n')}
          range={RETENTION_N_RANGE}
        />
      )}
      {states('tray') && (
        <ChoiceField
          name="tray"
          label={`Impression tray${of}`}
          id={id('tray')}
          none="does not apply"
          choices={TRAYS}
          words={TRAY_LABEL}
        />
      )}
      <NumberField
        name="torqueSpecNcm"
        label={`Torque${of} (N·cm, empty = hand-tight)`}
        id={id('torque')}
        range={TORQUE_NCM_RANGE}
      />
      <NumberField name="tolerancePct" label={`Tolerance${of} (%)`} id={id('tolerance')} range={TOLERANCE_PCT_RANGE} />
    </div>
  );
}

const UNSTATED = 'empty = not stated';

/** A number the catalogue states for the part, within the contract's range. */
function NumberField({
  name,
  label,
  id,
  range,
  stepSize,
}: {
  name: keyof PartValuesDraft;
  label: string;
  id: string;
  range: { min: number; max: number };
  stepSize?: number;
}) {
  return (
    <FormField name={name} label={label} labelFor={id} inline>
      <NumberInput name={name} buttonPosition="none" id={id} min={range.min} max={range.max} stepSize={stepSize} />
    </FormField>
  );
}

/** One of a closed list, or none (the empty option's words say what none means for this value). */
function ChoiceField<T extends string>({
  name,
  label,
  id,
  none,
  choices,
  words,
}: {
  name: keyof PartValuesDraft;
  label: string;
  id: string;
  none: string;
  choices: readonly T[];
  words: Record<T, string>;
}) {
  const { register } = useFormContext<PartValuesDraft>();
  return (
    <FormField name={name} label={label} labelFor={id} inline>
      <HTMLSelect id={id} {...register(name)}>
        <option value="">{none}</option>
        {choices.map((c) => (
          <option key={c} value={c}>
            {words[c].toLowerCase()}
          </option>
        ))}
      </HTMLSelect>
    </FormField>
  );
}
