import { Button, Icon } from '@blueprintjs/core';
import {
  type CatalogueComponent,
  COLLAR_HEIGHT_MM_RANGE,
  ComponentPatch,
  MANUFACTURER_CAUTION,
  PART_ANGLE_DEG_RANGE,
  TOLERANCE_PCT_RANGE,
} from '@torquetrail/contracts';
import { catalogueValuesRead, TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { COMPONENT_KIND_LABEL, INTERFACE_LABEL, TRAY_LABEL } from '../../../lib/clinical-labels';
import { applyServerErrors, draftSchema, errorAt, FieldError, NumberInput, useContractForm } from '../../../lib/forms';
import { useComponentVersions, useSaveComponent } from '../api/catalogue-api';
import { formatDateTime } from '../../../lib/dates';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';

interface SpecDraft {
  torqueSpecNcm: number | null;
  tolerancePct: number | null;
  angleDeg: number | null;
  collarHeightMm: number | null;
}

// An emptied tolerance is no number: the contract says so beside the field. An emptied angle or
// collar height is "not stated" (null), which the planner then reports as a Finding where a rule needs it.
const schema = draftSchema(ComponentPatch, (d: SpecDraft) => ({
  torqueSpecNcm: d.torqueSpecNcm,
  tolerancePct: d.tolerancePct ?? Number.NaN,
  angleDeg: d.angleDeg,
  collarHeightMm: d.collarHeightMm,
}));

/** The angle and collar height as the catalogue states them, and what a rule reads but is not stated. */
function statedValues(part: CatalogueComponent): string {
  const facts: string[] = [];
  if (part.angleDeg !== null) facts.push(`${part.angleDeg}°`);
  else if (catalogueValuesRead(part.kind).includes('angleDeg')) facts.push('angle not stated');
  if (part.collarHeightMm !== null) facts.push(`collar ${part.collarHeightMm} mm`);
  if (part.engaging === null && catalogueValuesRead(part.kind).includes('engaging'))
    facts.push('engaging or not: not stated');
  return facts.map((f) => `, ${f}`).join('');
}

/**
 * One part: its torque specification and tolerance, editable by the practice admin. The row is a
 * form without a <form> element (a table row cannot hold one): Save submits it.
 */
export function ComponentRow({ part }: { part: CatalogueComponent }) {
  const [editing, setEditing] = useState(false);
  const [showHistory, setShowHistory] = useState(false);
  useCloseOnEscape(editing, () => setEditing(false));
  const versions = useComponentVersions(part.id, showHistory);
  const form = useContractForm(schema, {
    torqueSpecNcm: part.torqueSpecNcm,
    tolerancePct: part.tolerancePct,
    angleDeg: part.angleDeg,
    collarHeightMm: part.collarHeightMm,
  });
  const save = useSaveComponent();
  const submit = form.handleSubmit((body) =>
    runMutation(
      save,
      { id: part.id, body },
      { onSuccess: () => setEditing(false), onError: (error) => applyServerErrors(form.setError, error) },
    ),
  );
  return (
    <FormProvider {...form}>
      <tr data-testid="catalogue-part">
        <td>{part.name}</td>
        <td className="mono">{part.referenceCode}</td>
        <td>{COMPONENT_KIND_LABEL[part.kind]}</td>
        <td>
          {part.engaging === null ? '—' : INTERFACE_LABEL[part.engaging ? 'engaging' : 'non-engaging'].toLowerCase()}
          {part.tray ? `, ${TRAY_LABEL[part.tray].toLowerCase()}` : ''}
          {editing ? (
            <>
              <NumberInput
                name="angleDeg"
                buttonPosition="none"
                aria-label={`Angle of ${part.referenceCode} (°, empty = not stated)`}
                min={PART_ANGLE_DEG_RANGE.min}
                max={PART_ANGLE_DEG_RANGE.max}
                intent={errorAt(form.formState.errors, 'angleDeg') ? 'danger' : 'none'}
              />
              <FieldError name="angleDeg" className="planner-error" />
              <NumberInput
                name="collarHeightMm"
                buttonPosition="none"
                aria-label={`Collar height of ${part.referenceCode} (mm, empty = not stated)`}
                min={COLLAR_HEIGHT_MM_RANGE.min}
                max={COLLAR_HEIGHT_MM_RANGE.max}
                intent={errorAt(form.formState.errors, 'collarHeightMm') ? 'danger' : 'none'}
              />
              <FieldError name="collarHeightMm" className="planner-error" />
            </>
          ) : (
            statedValues(part) && (
              <span aria-describedby="catalogue-caution" data-testid="catalogue-part-values">
                {statedValues(part)}{' '}
                <span
                  role="img"
                  aria-label={MANUFACTURER_CAUTION}
                  title={MANUFACTURER_CAUTION}
                  data-testid="catalogue-part-caution"
                >
                  <Icon icon="warning-sign" size={12} />
                </span>
              </span>
            )
          )}
          {part.kind === 'attachment-abutment'
            ? part.maxDivergenceDeg === null
              ? ', divergence tolerance not stated'
              : `, up to ${part.maxDivergenceDeg}° between implants`
            : ''}
          {part.retentionLabel ? `, ${part.retentionLabel}` : ''}
          {part.retentionN === null ? '' : `, ${part.retentionN} N`}
        </td>
        <td>
          {editing ? (
            <>
              <NumberInput
                name="torqueSpecNcm"
                buttonPosition="none"
                aria-label={`Torque of ${part.referenceCode} (N·cm, empty = hand-tight)`}
                min={TORQUE_NCM_RANGE.min}
                max={TORQUE_NCM_RANGE.max}
                intent={errorAt(form.formState.errors, 'torqueSpecNcm') ? 'danger' : 'none'}
              />
              <FieldError name="torqueSpecNcm" className="planner-error" />
            </>
          ) : part.torqueSpecNcm === null ? (
            'hand-tight'
          ) : (
            `${part.torqueSpecNcm} N·cm`
          )}
        </td>
        <td>
          {editing ? (
            <>
              <NumberInput
                name="tolerancePct"
                buttonPosition="none"
                aria-label={`Tolerance of ${part.referenceCode} (%)`}
                min={TOLERANCE_PCT_RANGE.min}
                max={TOLERANCE_PCT_RANGE.max}
              />
              <FieldError name="tolerancePct" className="planner-error" />
            </>
          ) : (
            `±${part.tolerancePct} %`
          )}
        </td>
        <td>
          {part.requiresLot ? 'lot required' : ''}
          {part.inUse ? (part.requiresLot ? ', in use' : 'in use') : ''}
          <br />
          <Button
            small
            variant="minimal"
            text={`Version ${part.version}, history`}
            aria-expanded={showHistory}
            onClick={() => setShowHistory(!showHistory)}
          />
        </td>
        <Can I="update" a="Catalogue">
          <td>
            {editing ? (
              <>
                <Button
                  small
                  intent="primary"
                  text="Save as new version"
                  loading={save.isPending}
                  onClick={() => void submit()}
                />
                <Button small variant="minimal" text="Cancel" onClick={() => setEditing(false)} />
                <p className="muted">Saves a new version: records keep the version they used.</p>
              </>
            ) : (
              <Button small variant="minimal" icon="edit" text="Edit" onClick={() => setEditing(true)} />
            )}
          </td>
        </Can>
      </tr>
      {showHistory && (
        <tr data-testid="catalogue-part-history">
          <td colSpan={8}>
            {versions.isPending && 'Loading the versions…'}
            {versions.isError && 'Could not load the versions of this part.'}
            {versions.data && (
              <ol aria-label={`Versions of ${part.referenceCode}`}>
                {versions.data.items.map((v) => (
                  <li key={v.id}>
                    Version {v.version}, saved {formatDateTime(v.versionedAt)}
                    {v.byName ? ` by ${v.byName}` : ''}: {v.name},{' '}
                    {v.torqueSpecNcm === null ? 'hand-tight' : `${v.torqueSpecNcm} N·cm`} ±{v.tolerancePct} %
                    {v.current ? ' (current)' : ''}
                  </li>
                ))}
              </ol>
            )}
          </td>
        </tr>
      )}
    </FormProvider>
  );
}
