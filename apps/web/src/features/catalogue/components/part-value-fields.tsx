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
        <FormField name="copingLevel" label={`Coping level${of}`} labelFor={id('coping-level')} inline>
          <HTMLSelect id={id('coping-level')} {...register('copingLevel')}>
            <option value="">not stated</option>
            {COPING_LEVELS.map((l) => (
              <option key={l} value={l}>
                {COPING_LEVEL_LABEL[l].toLowerCase()}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
      )}
      {states('angleDeg') && (
        <FormField name="angleDeg" label={`Angle${of} (°, empty = not stated)`} labelFor={id('angle')} inline>
          <NumberInput
            name="angleDeg"
            buttonPosition="none"
            id={id('angle')}
            min={PART_ANGLE_DEG_RANGE.min}
            max={PART_ANGLE_DEG_RANGE.max}
          />
        </FormField>
      )}
      {states('collarHeightMm') && (
        <FormField
          name="collarHeightMm"
          label={`Collar height${of} (mm, empty = not stated)`}
          labelFor={id('collar')}
          inline
        >
          <NumberInput
            name="collarHeightMm"
            buttonPosition="none"
            id={id('collar')}
            min={COLLAR_HEIGHT_MM_RANGE.min}
            max={COLLAR_HEIGHT_MM_RANGE.max}
            stepSize={0.5}
          />
        </FormField>
      )}
      {states('maxDivergenceDeg') && (
        <FormField
          name="maxDivergenceDeg"
          label={`Divergence tolerance between implants${of} (°, empty = not stated)`}
          labelFor={id('divergence')}
          inline
        >
          <NumberInput
            name="maxDivergenceDeg"
            buttonPosition="none"
            id={id('divergence')}
            min={MAX_DIVERGENCE_DEG_RANGE.min}
            max={MAX_DIVERGENCE_DEG_RANGE.max}
          />
        </FormField>
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
        <FormField
          name="retentionN"
          label={`Retention force${of} (N, empty = not stated)`}
          labelFor={id('retention-n')}
          inline
        >
          <NumberInput
            name="retentionN"
            buttonPosition="none"
            id={id('retention-n')}
            min={RETENTION_N_RANGE.min}
            max={RETENTION_N_RANGE.max}
          />
        </FormField>
      )}
      {states('tray') && (
        <FormField name="tray" label={`Impression tray${of}`} labelFor={id('tray')} inline>
          <HTMLSelect id={id('tray')} {...register('tray')}>
            <option value="">does not apply</option>
            {TRAYS.map((t) => (
              <option key={t} value={t}>
                {TRAY_LABEL[t].toLowerCase()}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
      )}
      <FormField name="torqueSpecNcm" label={`Torque${of} (N·cm, empty = hand-tight)`} labelFor={id('torque')} inline>
        <NumberInput
          name="torqueSpecNcm"
          buttonPosition="none"
          id={id('torque')}
          min={TORQUE_NCM_RANGE.min}
          max={TORQUE_NCM_RANGE.max}
        />
      </FormField>
      <FormField name="tolerancePct" label={`Tolerance${of} (%)`} labelFor={id('tolerance')} inline>
        <NumberInput
          name="tolerancePct"
          buttonPosition="none"
          id={id('tolerance')}
          min={TOLERANCE_PCT_RANGE.min}
          max={TOLERANCE_PCT_RANGE.max}
        />
      </FormField>
    </div>
  );
}
