import { Button } from '@blueprintjs/core';
import { type CatalogueComponent, ComponentPatch, TOLERANCE_PCT_RANGE } from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
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
}

// An emptied tolerance is no number: the contract says so beside the field.
const schema = draftSchema(ComponentPatch, (d: SpecDraft) => ({
  torqueSpecNcm: d.torqueSpecNcm,
  tolerancePct: d.tolerancePct ?? Number.NaN,
}));

/**
 * One part: its torque specification and tolerance, editable by the practice admin. The row is a
 * form without a <form> element (a table row cannot hold one): Save submits it.
 */
export function ComponentRow({ part }: { part: CatalogueComponent }) {
  const [editing, setEditing] = useState(false);
  const [showHistory, setShowHistory] = useState(false);
  useCloseOnEscape(editing, () => setEditing(false));
  const versions = useComponentVersions(part.id, showHistory);
  const form = useContractForm(schema, { torqueSpecNcm: part.torqueSpecNcm, tolerancePct: part.tolerancePct });
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
          {part.angleDeg ? `, ${part.angleDeg}°` : ''}
          {part.collarHeightMm ? `, collar ${part.collarHeightMm} mm` : ''}
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
