import { Button, Icon } from '@blueprintjs/core';
import { type CatalogueComponent, ComponentPatch, MANUFACTURER_CAUTION } from '@torquetrail/contracts';
import { catalogueValuesRead } from '@torquetrail/domain';
import { useId, useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { COMPONENT_KIND_LABEL, COPING_LEVEL_LABEL, INTERFACE_LABEL, TRAY_LABEL } from '../../../lib/clinical-labels';
import { applyServerErrors, draftSchema, useContractForm } from '../../../lib/forms';
import { useComponentVersions, useSaveComponent } from '../api/catalogue-api';
import { formatDateTime } from '../../../lib/dates';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';
import { PartValueFields, partValuesBody, partValuesDraft, type PartValuesDraft } from './part-value-fields';

/** The values the catalogue states for a part, and what a rule reads but is not stated. */
function statedValues(part: CatalogueComponent): string {
  const facts: string[] = [];
  const read = catalogueValuesRead(part.kind);
  if (part.angleDeg !== null) facts.push(`${part.angleDeg}°`);
  else if (read.includes('angleDeg')) facts.push('angle not stated');
  if (part.collarHeightMm !== null) facts.push(`collar ${part.collarHeightMm} mm`);
  if (part.engaging === null && read.includes('engaging')) facts.push('engaging or not: not stated');
  if (part.copingLevel !== null) facts.push(COPING_LEVEL_LABEL[part.copingLevel].toLowerCase());
  else if (read.includes('copingLevel')) facts.push('coping level not stated');
  if (part.kind === 'attachment-abutment')
    facts.push(
      part.maxDivergenceDeg === null
        ? 'divergence tolerance not stated'
        : `up to ${part.maxDivergenceDeg}° between implants`,
    );
  if (part.retentionLabel) facts.push(part.retentionLabel);
  if (part.retentionN !== null) facts.push(`${part.retentionN} N`);
  return facts.map((f) => `, ${f}`).join('');
}

/**
 * One part, and for the practice admin its edit: the same field set as adding a part
 * (PartValueFields), in a form spanning the row. Saving makes a new version (ADR 0006).
 */
export function ComponentRow({ part }: { part: CatalogueComponent }) {
  const uid = useId();
  const [editing, setEditing] = useState(false);
  const [showHistory, setShowHistory] = useState(false);
  useCloseOnEscape(editing, () => setEditing(false));
  const versions = useComponentVersions(part.id, showHistory);
  // Only the values this kind states are sent: the platform and kind of a part never change.
  const schema = useMemo(
    () => draftSchema(ComponentPatch, (d: PartValuesDraft) => partValuesBody(d, part.kind, true)),
    [part.kind],
  );
  const form = useContractForm(schema, partValuesDraft(part));
  const save = useSaveComponent();
  const submit = form.handleSubmit((body) =>
    runMutation(
      save,
      { id: part.id, body },
      { onSuccess: () => setEditing(false), onError: (error) => applyServerErrors(form.setError, error) },
    ),
  );
  const stated = statedValues(part);
  return (
    <FormProvider {...form}>
      <tr data-testid="catalogue-part">
        {editing ? (
          <td colSpan={6}>
            <form aria-label={`Edit ${part.referenceCode}`} onSubmit={(event) => void submit(event)}>
              <strong>
                {part.name} <span className="mono">{part.referenceCode}</span> ({COMPONENT_KIND_LABEL[part.kind]})
              </strong>
              <PartValueFields kind={part.kind} idPrefix={uid} subject={part.referenceCode} />
              <Button type="submit" small intent="primary" text="Save as new version" loading={save.isPending} />
              <Button small variant="minimal" text="Cancel" onClick={() => setEditing(false)} />
              <p className="muted">Saves a new version: records keep the version they used.</p>
            </form>
          </td>
        ) : (
          <>
            <td>{part.name}</td>
            <td className="mono">{part.referenceCode}</td>
            <td>{COMPONENT_KIND_LABEL[part.kind]}</td>
            <td>
              {part.engaging === null
                ? '—'
                : INTERFACE_LABEL[part.engaging ? 'engaging' : 'non-engaging'].toLowerCase()}
              {part.tray ? `, ${TRAY_LABEL[part.tray].toLowerCase()}` : ''}
              {stated && (
                <span aria-describedby="catalogue-caution" data-testid="catalogue-part-values">
                  {stated}{' '}
                  <span
                    role="img"
                    aria-label={MANUFACTURER_CAUTION}
                    title={MANUFACTURER_CAUTION}
                    data-testid="catalogue-part-caution"
                  >
                    <Icon icon="warning-sign" size={12} />
                  </span>
                </span>
              )}
            </td>
            <td>{part.torqueSpecNcm === null ? 'hand-tight' : `${part.torqueSpecNcm} N·cm`}</td>
            <td>{`±${part.tolerancePct} %`}</td>
          </>
        )}
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
            {!editing && <Button small variant="minimal" icon="edit" text="Edit" onClick={() => setEditing(true)} />}
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
